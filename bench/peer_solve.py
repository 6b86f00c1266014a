"""numpy peer of `betabound solve FILE --low L --high H [--rf COL] --format json`: read the CSV with
numpy.loadtxt, excess returns, numpy.cov, the two OLS fits (numpy.linalg.lstsq) with classical
standard errors, the bounds, an 11-point grid with every candidate field, the five landmarks, JSON
out. Not computed (solve does them, so this peer does less work): p-values (they need scipy's t
distribution; importing scipy alone costs more than the whole job on 2,520 rows), date parsing and
validation, frequency detection, diagnostics wording.

Usage: python3 bench/peer_solve.py FILE LOW HIGH [RF_COLUMN]
"""

import json
import sys

import numpy as np

from peer_common import bounds, equal_noise, read_columns, structure_at

W = 0.5
STEPS = 11


def ols(x, y):
    n = len(x)
    X = np.column_stack([np.ones(n), x])
    coef = np.linalg.lstsq(X, y, rcond=None)[0]
    resid = y - X @ coef
    ssr = float(resid @ resid)
    s2 = ssr / (n - 2)
    cov = s2 * np.linalg.inv(X.T @ X)
    yc = y - y.mean()
    a_se, b_se = float(np.sqrt(cov[0, 0])), float(np.sqrt(cov[1, 1]))
    return {
        "observations": n,
        "alpha": float(coef[0]),
        "beta": float(coef[1]),
        "alphaStdErr": a_se,
        "betaStdErr": b_se,
        "alphaTStat": float(coef[0]) / a_se,
        "betaTStat": float(coef[1]) / b_se,
        "rSquared": 1 - ssr / float(yc @ yc),
        "residualVariance": ssr / (n - 1),
        "residualStdError": float(np.sqrt(s2)),
        "residualSumOfSquares": ssr,
    }


def tolist(tree):
    if isinstance(tree, dict):
        return {k: tolist(v) for k, v in tree.items()}
    if isinstance(tree, list):
        return [tolist(v) for v in tree]
    if isinstance(tree, np.ndarray):
        return tree.tolist()
    if isinstance(tree, np.generic):
        return tree.item()
    return tree


def main():
    path, low_name, high_name = sys.argv[1:4]
    rf_name = sys.argv[4] if len(sys.argv) > 4 else None
    _, cols = read_columns(path, [low_name, high_name] + ([rf_name] if rf_name else []))
    rf = cols[2] if rf_name else 0.0
    low = cols[0] - rf
    high = cols[1] - rf
    market = W * low + (1 - W) * high
    n = len(low)
    data = np.vstack([low, high, market])
    means = data.mean(axis=1)
    cov = np.cov(data, ddof=1)
    sd = np.sqrt(np.diag(cov))
    corr = cov / np.outer(sd, sd)
    series = lambda i: {"mean": means[i], "variance": cov[i, i], "stdev": sd[i], "sharpeRatio": means[i] / sd[i]}
    moments = {
        "low": series(0), "high": series(1), "market": series(2),
        "covariance": {"lowHigh": cov[0, 1], "lowMarket": cov[0, 2], "highMarket": cov[1, 2]},
        "correlation": {"lowHigh": corr[0, 1], "lowMarket": corr[0, 2], "highMarket": corr[1, 2]},
    }
    capm = {"low": ols(market, low), "high": ols(market, high)}
    vl, vh, c = cov[0, 0], cov[1, 1], cov[0, 1]
    ml, mh = means[0], means[1]
    lower, upper, h_up, h_low, phi_min, phi_max = bounds(W, vl, vh, c)
    frac = np.arange(STEPS) / (STEPS - 1)
    b = lower + (upper - lower) * frac
    bh = h_low + (h_up - h_low) * frac
    b[-1], bh[-1] = upper, h_up
    grid = structure_at(b, bh, W, ml, mh, vl, vh, c)
    grid_list = [{k: (v[i] if not isinstance(v, dict) else {kk: vv[i] for kk, vv in v.items()}) for k, v in grid.items()} for i in range(STEPS)]
    clamp = lambda x: min(max(x, lower), upper)
    lam = W * ml + (1 - W) * mh
    at = lambda x: structure_at(np.float64(x), (1 - W * x) / (1 - W), W, ml, mh, vl, vh, c)
    implied = ml / lam
    landmarks = {
        "lowNoiseFree": structure_at(upper, h_up, W, ml, mh, vl, vh, c),
        "highNoiseFree": structure_at(lower, h_low, W, ml, mh, vl, vh, c),
        "equalNoise": at(clamp(equal_noise(W, vl, vh, c))),
        "capmConsistent": at(clamp(capm["low"]["beta"])),
        "returnImplied": at(implied) if abs(lam) >= sd[2] / np.sqrt(n) and 0 < implied < 1 / W else None,
    }
    out = {
        "observations": n, "weight": W, "moments": moments, "capm": capm,
        "bounds": {"lowBeta": {"min": lower, "max": upper}, "highBeta": {"min": h_up, "max": h_low},
                   "factorVariance": {"min": phi_min, "max": phi_max}},
        "grid": grid_list, "landmarks": landmarks,
    }
    sys.stdout.write(json.dumps(tolist(out), indent=2) + "\n")


if __name__ == "__main__":
    main()
