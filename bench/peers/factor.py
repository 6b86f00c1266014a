"""The k-portfolio one-factor model (docs/methods.md §31) in numpy, for the numpy peer: maximum likelihood
by Joreskog's (1967) fixed point with numpy.linalg.eigh (lambda = Psi^(1/2) v sqrt(theta - 1) from the
leading eigenpair of Psi^(-1/2) S Psi^(-1/2), then Psi = diag(S - lambda lambda')), on the correlation
scale and carried back; loadings scaled so that the market proxy has beta 1; standard errors from the
inverse Wishart information of (lambda, Psi) by the delta method; Bartlett's statistic. Interior
solutions only (no Heywood boundary search): the benchmark's data have none. Numbers go out as Python
floats."""

import numpy as np


def _loadings(s, psi):
    root = np.sqrt(psi)
    values, vectors = np.linalg.eigh(s / np.outer(root, root))
    return root * vectors[:, -1] * np.sqrt(max(values[-1] - 1.0, 0.0))


def _fit(r):
    k = len(r)
    psi = (1 - 1 / (2 * k)) / np.diag(np.linalg.inv(r))
    for _ in range(20_000):
        lam = _loadings(r, psi)
        nxt = np.maximum(np.diag(r) - lam * lam, 1e-10 * np.diag(r))
        moved = np.max(np.abs(nxt - psi) / np.diag(r))
        psi = nxt
        if moved <= 1e-15:
            break
    return _loadings(r, psi), psi


def factor_digest(columns, weights, n):
    """Digest paths of our `factorModel` for the excess-return series `columns` (k x n)."""
    k = len(columns)
    w = np.asarray(weights, dtype=np.float64) / np.sum(weights)
    s = np.cov(columns, ddof=1)
    sw = s @ w
    capm = sw / (w @ sw)
    d = np.sqrt(np.diag(s))
    lam_r, psi_r = _fit(s / np.outer(d, d))
    lam = lam_r * d
    scale = w @ lam
    sign = np.sign(scale)
    loadings = sign * lam / (sign * scale)
    psi = psi_r * np.diag(s)
    # Inverse information of (lambda_r, psi_r) on the correlation scale, then the delta method.
    sigma = np.outer(lam_r, lam_r) + np.diag(psi_r)
    p = np.linalg.inv(sigma)
    g = p @ lam_r
    q = lam_r @ g
    info = np.block([[2 * (q * p + np.outer(g, g)), 2 * p * g[None, :]], [2 * (p * g[None, :]).T, p * p]]) * (n - 1) / 2
    cov = np.linalg.inv(info)[:k, :k]
    sc = sign * scale
    jac = d[None, :] * (np.eye(k) / sc - np.outer(lam, w) / (sc * sc))
    errors = np.sqrt(np.diag(jac @ cov @ jac.T))
    sign_r, logdet_sigma = np.linalg.slogdet(sigma)
    _, logdet_r = np.linalg.slogdet(s / np.outer(d, d))
    discrepancy = max(logdet_sigma + np.trace((s / np.outer(d, d)) @ p) - logdet_r - k, 0.0)
    statistic = max(n - 1 - (2 * k + 5) / 6 - 2 / 3, 0) * discrepancy
    out = {"factorModel.factorVariance": float(scale * scale), "factorModel.fit.statistic": float(statistic)}
    for i in range(k):
        base = f"factorModel.portfolios.{i}."
        out[base + "loading"] = float(loadings[i])
        out[base + "noiseVariance"] = float(psi[i])
        out[base + "loadingStdError"] = float(errors[i])
        out[base + "capmBeta"] = float(capm[i])
    return out
