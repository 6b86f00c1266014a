"""The pricing section of `solve`'s JSON at the default uncertainty, in numpy, for every peer
(docs/methods.md §26, §30): can noise in the measured betas explain the low book's CAPM alpha?

- The six statistics mu_x, lambda = w mu_x + (1 - w) mu_y, d1 = mu_x - Lb lambda, d2 = U lambda - mu_x and
  the explainable alphas' ends e_L = (Lb - beta) lambda, e_U = (U - beta) lambda (beta the low book's CAPM
  beta on the market proxy), with influence series from their gradients in the five moments
  (mu_x, mu_y, V_x, V_y, C) times the centred moment contributions; one Bartlett long-run covariance of
  the six (centred; the Newey-West (1994) lag of their sum, as the CAPM fits') over T gives every variance.
- The return-implied low beta mu_x / lambda: delta-method standard error and Fieller's (1954) interval
  (the roots of a quadratic; reported only when bounded).
- The test: t_j = d_j / se(d_j); each sign branch's statistic max_j(-t_j) with generalized moment
  selection (Andrews & Soares 2010: kappa = sqrt(ln T)); p-value the larger branch's
  P(max of the selected Z_j >= T), Z bivariate normal with the estimates' correlation (Genz 2004, below);
  the intersection-union p-value (Berger 1982) 1 - Phi(max(min(t1, t2), min(-t1, -t2))).
- The alpha decomposition per book (the high book's alphas are -w/(1-w) times the low's, its ends
  swapped), per period and annualised (times the periods a year; none when the frequency is unknown).
"""

import math
from statistics import NormalDist

import numpy as np

from inference import kernel_sum

_normal = NormalDist()


def normal_cdf(x):
    return 0.5 * math.erfc(-x / math.sqrt(2))


def _gauss_legendre(points):
    """Nodes in (0, 1) of the symmetric Gauss-Legendre rule and their weights (numpy's own)."""
    nodes, weights = np.polynomial.legendre.leggauss(points)
    keep = nodes > 0
    return nodes[keep], weights[keep]


_RULES = [_gauss_legendre(6), _gauss_legendre(12), _gauss_legendre(20)]


def bivariate_upper(h, k, r):
    """P(X > h, Y > k) for standard normals with correlation r: Genz (2004), "Numerical computation of
    rectangular bivariate and trivariate normal and t probabilities" (Drezner-Wesolowsky's integral by
    Gauss-Legendre rules of 6, 12 or 20 points as |r| grows; a series-corrected form for |r| >= 0.925)."""
    if r >= 1:
        return normal_cdf(-max(h, k))
    if r <= -1:
        return max(0.0, normal_cdf(-h) - normal_cdf(k))
    x, wt = _RULES[0] if abs(r) < 0.3 else _RULES[1] if abs(r) < 0.75 else _RULES[2]
    nodes = np.concatenate([-x, x])
    weights = np.concatenate([wt, wt])
    hk = h * k
    if abs(r) < 0.925:
        hs = (h * h + k * k) / 2
        asr = math.asin(r)
        sn = np.sin(asr * (nodes + 1) / 2)
        total = float(np.sum(weights * np.exp((sn * hk - hs) / (1 - sn * sn))))
        return min(1.0, max(0.0, total * asr / (4 * math.pi) + normal_cdf(-h) * normal_cdf(-k)))
    if r < 0:
        k, hk = -k, -hk
    a_s = (1 - r) * (1 + r)
    a = math.sqrt(a_s)
    bs = (h - k) ** 2
    c = (4 - hk) / 8
    d = (12 - hk) / 16
    total = 0.0
    asr = -(bs / a_s + hk) / 2
    if asr > -100:
        total = a * math.exp(asr) * (1 - c * (bs - a_s) * (1 - d * bs / 5) / 3 + c * d * a_s * a_s / 5)
    if -hk < 100:
        b = math.sqrt(bs)
        total -= math.exp(-hk / 2) * math.sqrt(2 * math.pi) * normal_cdf(-b / a) * b * (1 - c * bs * (1 - d * bs / 5) / 3)
    a /= 2
    xs = (a * (nodes + 1)) ** 2
    rs = np.sqrt(1 - xs)
    asr = -(bs / xs + hk) / 2
    ok = asr > -100
    terms = a * weights * np.exp(asr) * (np.exp(-hk * (1 - rs) / (2 * (1 + rs))) / rs - (1 + c * xs * (1 + d * xs)))
    total = -(total + float(np.sum(terms[ok]))) / (2 * math.pi)
    if r > 0:
        return min(1.0, max(0.0, total + normal_cdf(-max(h, k))))
    total = -total
    if k > h:
        total += normal_cdf(k) - normal_cdf(h)
    return min(1.0, max(0.0, total))


def _branch(s1, s2, rho, kappa):
    statistic = max(-s1, -s2)
    first, second = s1 <= kappa, s2 <= kappa
    if first and second:
        return statistic, 1 - bivariate_upper(-statistic, -statistic, rho)
    if first or second:
        return statistic, 1 - normal_cdf(statistic)
    return statistic, 1.0


def pricing_digest(x, y, w, alpha_se_low, alpha_se_high, periods_per_year, confidence=0.95):
    """The pricing section's numbers by JSON path, from the excess returns (numpy arrays)."""
    n = len(x)
    v = 1 - w
    mx, my = x.mean(), y.mean()
    dx, dy = x - mx, y - my
    vx, vy, c = dx @ dx / (n - 1), dy @ dy / (n - 1), dx @ dy / (n - 1)
    if not c > 0:
        return {}
    lam = w * mx + v * my
    if lam == 0:
        raise ValueError("the mean excess market return is exactly 0: no return-implied beta (not a bench case)")
    dl, du = v * vy + w * c, w * vx + v * c
    lower, upper = c / dl, vx / du
    var_m = w * w * vx + 2 * w * v * c + v * v * vy
    beta = du / var_m
    # Influence series: the gradients of Lb and U (§4) and of beta (the quotient rule), written into one
    # array of six columns and centred in place (long_run's arithmetic without its copies: at 10 million
    # rows every temporary is 80 MB).
    u = np.empty((n, 6))
    u[:, 0] = dx
    u[:, 1] = i_lam = w * dx + v * dy
    zx, zy, zc = dx * dx - vx, dy * dy - vy, dx * dy - c
    i_lower = (-v * c / dl**2) * zy + (v * vy / dl**2) * zc
    i_upper = (v * c / du**2) * zx + (-v * vx / du**2) * zc
    i_beta = (w * zx + v * zc - beta * (w * w * zx + 2 * w * v * zc + v * v * zy)) / var_m
    del zx, zy, zc
    u[:, 2] = dx - lower * i_lam - lam * i_lower
    u[:, 3] = upper * i_lam + lam * i_upper - dx
    u[:, 4] = lam * (i_lower - i_beta) + (lower - beta) * i_lam
    u[:, 5] = lam * (i_upper - i_beta) + (upper - beta) * i_lam
    del i_lam, i_lower, i_upper, i_beta
    u -= u.mean(axis=0)
    cov = kernel_sum(u, np.ones(6))[0] / n / n
    del u
    se = np.sqrt(np.maximum(np.diag(cov), 0.0))
    z = _normal.inv_cdf(1 - (1 - confidence) / 2)
    out = {}
    # The return-implied low beta: delta method and Fieller's interval.
    ratio = mx / lam
    out["pricing.returnImpliedLowBeta.estimate"] = ratio
    out["pricing.returnImpliedLowBeta.stdError"] = math.sqrt(max(0.0, cov[0, 0] - 2 * ratio * cov[0, 1] + ratio * ratio * cov[1, 1])) / abs(lam)
    qa = lam * lam - z * z * cov[1, 1]
    qb = mx * lam - z * z * cov[0, 1]
    qc = mx * mx - z * z * cov[0, 0]
    if qa > 0:
        root = math.sqrt(max(0.0, qb * qb - qa * qc))
        out["pricing.returnImpliedLowBeta.lower"] = (qb - root) / qa
        out["pricing.returnImpliedLowBeta.upper"] = (qb + root) / qa
    # The test.
    if se[2] > 0 and se[3] > 0:
        t1, t2 = (mx - lower * lam) / se[2], (upper * lam - mx) / se[3]
        rho = max(-1.0, min(1.0, cov[2, 3] / (se[2] * se[3])))
        kappa = math.sqrt(math.log(n))
        (s_pos, p_pos), (s_neg, p_neg) = _branch(t1, t2, rho, kappa), _branch(-t1, -t2, rho, kappa)
        out["pricing.test.statistic"] = min(s_pos, s_neg)
        out["pricing.test.pValue"] = max(p_pos, p_neg)
        out["pricing.test.explainedPValue"] = 0.5 * math.erfc(max(min(t1, t2), min(-t1, -t2)) / math.sqrt(2))
    # The alpha decomposition of each book.
    observed = mx - beta * lam
    ends, end_ses = [(lower - beta) * lam, (upper - beta) * lam], [se[4], se[5]]
    for book, factor, alpha_se in (("low", 1.0, alpha_se_low), ("high", -w / v, alpha_se_high)):
        e = [factor * ends[0], factor * ends[1]]
        s = [abs(factor) * end_ses[0], abs(factor) * end_ses[1]]
        at_min = 0 if e[0] <= e[1] else 1
        a, lo, hi = factor * observed, e[at_min], e[1 - at_min]
        values = {"observed": a, "observedLower": a - z * alpha_se, "observedUpper": a + z * alpha_se, "explainableMin": lo,
                  "explainableMax": hi, "explainableMinStdError": s[at_min], "explainableMaxStdError": s[1 - at_min],
                  "unexplained": a - lo if a < lo else a - hi if a > hi else 0.0}  # fmt: skip
        for name, value in values.items():
            out[f"pricing.alpha.{book}.{name}"] = value
            if periods_per_year is not None:
                out[f"pricing.alpha.{book}.annualised.{name}"] = value * periods_per_year
    return {k: float(val) for k, val in out.items()}
