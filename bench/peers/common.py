"""What the three peers share: the job's description (one JSON argument), the pairs' digests, the
stationary bootstrap (numpy) and the digest file.

A job is {"job": "solve" | "roll", "file", "dateColumn", "pairs": [[low, high], ...], "rf": column or
null, "weight", "uncertainty": bool, "bootstrap": replicates or 0, "seed", "window", "step", "out"}.
`solve` writes the pairs' numbers by JSON path (write_digest: each list of paths once); `roll` writes
a CSV with start, end, observations and the 30 numbers of `roll --format csv` by the same names.
"""

import json
import math
import sys
from statistics import NormalDist

import numpy as np

from formulas import solve_digest
from inference import uncertainty_digest
from pricing import pricing_digest


def read_job():
    return json.loads(sys.argv[1])


def pair_digest(job, low, high, n, ml, mh, vl, vh, c, excess=None):
    """The digest of one pair; `excess` returns the (x, y) arrays when the uncertainty needs them."""
    values = solve_digest(job["weight"], n, ml, mh, vl, vh, c)
    if job.get("uncertainty"):
        x, y = excess()
        values.update(uncertainty_digest(x, y, job["weight"]))
        alpha_ses = values["capm.low.hac.alphaStdErr"], values["capm.high.hac.alphaStdErr"]
        values.update(pricing_digest(x, y, job["weight"], *alpha_ses, job["periodsPerYear"]))
        if job.get("bootstrap"):
            values.update(bootstrap_digest(x, y, job["weight"], job["bootstrap"], job.get("seed", 1)))
    return {"low": low, "high": high, "values": values}


def write_digest(job, engine, pairs):
    """Writes {"engine", "pathSets": [[JSON path, ...], ...], "pairs": [{"low", "high", "paths": index of
    the pair's path set, "values": [number or null, ...]}]}: each list of paths once, not once a pair
    (a batch's pairs share them), so the file stays about the size of our own output."""
    sets, index, packed = [], {}, []
    for p in pairs:
        paths = tuple(p["values"])
        k = index.get(paths)
        if k is None:
            k = index[paths] = len(sets)
            sets.append(list(paths))
        packed.append({"low": p["low"], "high": p["high"], "paths": k, "values": list(p["values"].values())})
    # json.dumps (one shot) runs the C encoder; json.dump to a file runs the pure-Python one, slower.
    text = json.dumps({"engine": engine, "pathSets": sets, "pairs": packed})
    with open(job["out"], "w") as f:
        f.write(text + "\n")


QUANTITIES = ["lowBetaMin", "lowBetaMax", "highBetaMin", "highBetaMax", "lowCapmBeta", "highCapmBeta", "lowCapmAlpha",
              "highCapmAlpha", "capmConsistentLowBeta", "equalNoiseLowBeta", "returnImpliedLowBeta", "lowSharpe", "highSharpe",
              "marketSharpe"]  # fmt: skip


def replicate_statistics(n, w, ml, mh, vl, vh, c):
    """docs/methods.md §21: the statistics of each replicate from its means and second moments (arrays)."""
    v = 1 - w
    mv = w * w * vl + 2 * w * v * c + v * v * vh
    mm = w * ml + v * mh
    bl = (w * vl + v * c) / mv
    bh = (w * c + v * vh) / mv
    with np.errstate(divide="ignore", invalid="ignore"):
        ok = (c > 0) & (vl > 0) & (vh > 0) & (mv > 0)
        lower = np.where(ok, c / (v * vh + w * c), np.nan)
        upper = np.where(ok, np.maximum(lower, vl / (w * vl + v * c)), np.nan)
        d = vh - vl
        equal = 1 / (w + v * (d + np.sqrt(d * d + 4 * c * c)) / (2 * c))
        implied = ml / mm
        implied_ok = ok & (np.abs(mm) >= np.sqrt(mv / n)) & (implied > 0) & (implied < 1 / w)
        return [lower, upper, (1 - w * upper) / v, (1 - w * lower) / v, bl, bh, ml - bl * mm, mh - bh * mm,
                np.where(ok, np.clip(bl, lower, upper), np.nan), np.where(ok, np.clip(equal, lower, upper), np.nan),
                np.where(implied_ok, implied, np.nan), ml / np.sqrt(vl), mh / np.sqrt(vh), mm / np.sqrt(mv)]  # fmt: skip


def bootstrap_digest(x, y, w, replicates, seed, chunk=500):
    """Stationary bootstrap (Politis & Romano 1994) with the automatic mean block length (3 sqrt(n), at most
    n/3, at least 1; docs/methods.md §7.2), vectorised over
    a chunk of replicates at a time (a replicate x row index matrix): a block starts at each row with
    probability 1/b (always at row 0) at a uniform start, and runs on mod n. Percentile limits are
    stretched from the median by Kiefer-Vogelsang's fixed-b factor at b = 2 block / n (§7.2). numpy's
    generator: the draws differ from ours, so the summaries agree only to Monte Carlo error."""
    n = len(x)
    block = max(1.0, min(3 * math.sqrt(n), n / 3))
    fb = min(1.0, 2 * block / n)
    k = (1.96 + 2.9694 * fb + 0.416 * fb * fb - 0.5324 * fb**3) / NormalDist().inv_cdf(0.975)
    cl, ch = x.mean(), y.mean()
    xc, yc = x - cl, y - ch
    rng = np.random.default_rng(seed)
    rows = np.arange(n)
    draws = np.empty((len(QUANTITIES), replicates))
    for first in range(0, replicates, chunk):
        r = min(chunk, replicates - first)
        new = rng.random((r, n)) < 1 / block
        new[:, 0] = True
        starts = rng.integers(0, n, size=(r, n))
        last = np.maximum.accumulate(np.where(new, rows, 0), axis=1)
        idx = np.take_along_axis(starts, last, axis=1) + (rows - last)
        idx %= n
        xs, ys = xc[idx], yc[idx]
        sx, sy = xs.sum(axis=1), ys.sum(axis=1)
        sxx, syy, sxy = np.einsum("ij,ij->i", xs, xs), np.einsum("ij,ij->i", ys, ys), np.einsum("ij,ij->i", xs, ys)
        stats = replicate_statistics(n, w, cl + sx / n, ch + sy / n, (sxx - sx * sx / n) / (n - 1),
                                     (syy - sy * sy / n) / (n - 1), (sxy - sx * sy / n) / (n - 1))  # fmt: skip
        for q, values in enumerate(stats):
            draws[q, first : first + r] = values
    out = {"uncertainty.bootstrap.blockLength": block}
    for q, name in enumerate(QUANTITIES):
        d = draws[q][np.isfinite(draws[q])]
        if d.size >= 2:
            out[f"uncertainty.bootstrap.stdErrors.{name}"] = float(d.std(ddof=1))
            lo, med, hi = np.percentile(d, [2.5, 50, 97.5])
            lo, hi = med - k * (med - lo), med + k * (hi - med)
            out[f"uncertainty.bootstrap.intervals.{name}.lower"] = float(lo)
            out[f"uncertainty.bootstrap.intervals.{name}.upper"] = float(hi)
    return out
