"""numpy peer of case (c): a vectorised stationary bootstrap (Politis & Romano 1994) of the
quantities src/core/inference/bootstrap/statistics.ts recomputes per replicate, with percentile
intervals (type 7, numpy's default) and bootstrap standard errors, JSON out.

Resampling, vectorised over a chunk of replicates at a time (a replicate x row matrix): a new block
starts at each row with probability p = 1/b (always at row 0) at a uniform start; the row index is
the block's start plus the distance to it, mod n (np.maximum.accumulate finds each row's block).
Then the centred excess returns are gathered and the five sums taken along the rows. The same work
per replicate as ours (every resampled row touched once); numpy's own generator, so the draws differ
from ours and the figures agree only to Monte Carlo error.

Usage: python3 bench/peer_bootstrap.py FILE LOW HIGH REPLICATES BLOCK SEED
"""

import json
import sys

import numpy as np

from peer_common import equal_noise, read_columns

W = 0.5
CHUNK = 500
NAMES = ["lowBetaMin", "lowBetaMax", "highBetaMin", "highBetaMax", "lowCapmBeta", "highCapmBeta", "lowCapmAlpha",
         "highCapmAlpha", "capmConsistentLowBeta", "equalNoiseLowBeta", "returnImpliedLowBeta", "lowSharpe", "highSharpe",
         "marketSharpe"]


def statistics(n, ml, mh, vl, vh, c):
    v = 1 - W
    mv = W * W * vl + 2 * W * v * c + v * v * vh
    mm = W * ml + v * mh
    bl = (W * vl + v * c) / mv
    bh = (W * c + v * vh) / mv
    with np.errstate(divide="ignore", invalid="ignore"):
        ok = c > 0
        lower = np.where(ok, c / (v * vh + W * c), np.nan)
        upper = np.where(ok, np.maximum(lower, vl / (W * vl + v * c)), np.nan)
        implied = ml / mm
        implied_ok = ok & (mm != 0) & (np.abs(mm) >= np.sqrt(mv / n)) & (implied > 0) & (implied < 1 / W)
        return [lower, upper, (1 - W * upper) / v, (1 - W * lower) / v, bl, bh, ml - bl * mm, mh - bh * mm,
                np.clip(bl, lower, upper), np.where(ok, np.clip(equal_noise(W, vl, vh, c), lower, upper), np.nan),
                np.where(implied_ok, implied, np.nan), ml / np.sqrt(vl), mh / np.sqrt(vh), mm / np.sqrt(mv)]


def main():
    path, low_name, high_name = sys.argv[1:4]
    replicates, block, seed = int(sys.argv[4]), float(sys.argv[5]), int(sys.argv[6])
    _, (low, high) = read_columns(path, [low_name, high_name])
    n = len(low)
    cl, ch = low.mean(), high.mean()
    x, y = low - cl, high - ch
    rng = np.random.default_rng(seed)
    p = 1 / block
    rows = np.arange(n)
    draws = np.empty((len(NAMES), replicates))
    for first in range(0, replicates, CHUNK):
        r = min(CHUNK, replicates - first)
        new = rng.random((r, n)) < p
        new[:, 0] = True
        starts = rng.integers(0, n, size=(r, n))
        last = np.maximum.accumulate(np.where(new, rows, 0), axis=1)
        idx = np.take_along_axis(starts, last, axis=1) + (rows - last)
        idx %= n
        xs, ys = x[idx], y[idx]
        sx, sy = xs.sum(axis=1), ys.sum(axis=1)
        sxx, syy, sxy = np.einsum("ij,ij->i", xs, xs), np.einsum("ij,ij->i", ys, ys), np.einsum("ij,ij->i", xs, ys)
        stats = statistics(n, cl + sx / n, ch + sy / n, (sxx - sx * sx / n) / (n - 1), (syy - sy * sy / n) / (n - 1),
                           (sxy - sx * sy / n) / (n - 1))
        for q, values in enumerate(stats):
            draws[q, first : first + r] = values
    intervals, errors, valid = {}, {}, {}
    for q, name in enumerate(NAMES):
        d = draws[q][~np.isnan(draws[q])]
        valid[name] = int(d.size)
        if d.size < 2:
            intervals[name], errors[name] = None, None
            continue
        lo, hi = np.percentile(d, [2.5, 97.5])
        intervals[name] = {"lower": float(lo), "upper": float(hi)}
        errors[name] = float(d.std(ddof=1))
    both = ~np.isnan(draws[0]) & ~np.isnan(draws[1])
    out = {"replicates": replicates, "blockLength": block, "seed": seed, "confidence": 0.95, "intervals": intervals,
           "stdErrors": errors, "validReplicates": valid,
           "boundsCorrelation": float(np.corrcoef(draws[0][both], draws[1][both])[0, 1]) if both.sum() >= 2 else None}
    sys.stdout.write(json.dumps(out, indent=2) + "\n")


if __name__ == "__main__":
    main()
