"""numpy peer: numpy.loadtxt of the columns the job uses, numpy moments (mean, np.cov), the closed forms
of formulas.py, the uncertainty of inference.py; roll from cumulative sums of the centred series.
Dates are read only by roll (which writes them); solve reads the numbers alone. With "portfolios", the
k-portfolio factor model of factor.py as well."""

import sys

import numpy as np

from common import pair_digest, read_job, write_digest
from factor import factor_digest
from formulas import ROLL_COLUMNS, NumpyOps, columns


def header_of(path):
    with open(path) as f:
        return f.readline().strip().split(",")


def load(job, names, with_dates=False):
    header = header_of(job["file"])
    index = [header.index(name) for name in names]
    data = np.loadtxt(job["file"], delimiter=",", skiprows=1, usecols=index, dtype=np.float64, ndmin=2)
    cols = dict(zip(names, data.T))
    dates = None
    if with_dates:
        dates = np.loadtxt(job["file"], delimiter=",", skiprows=1, usecols=[header.index(job["dateColumn"])], dtype=str)
    return cols, dates


def used_names(job):
    names = []
    for pair in job["pairs"]:
        names += [n for n in pair if n not in names]
    names += [n for n in job.get("portfolios", []) if n not in names]
    if job.get("rf") and job["rf"] not in names:
        names.append(job["rf"])
    return names


def solve(job):
    cols, _ = load(job, used_names(job))
    rf = cols[job["rf"]] if job.get("rf") else 0.0
    pairs = []
    for low, high in job["pairs"]:
        x, y = cols[low] - rf, cols[high] - rf
        n = len(x)
        cov = np.cov(np.vstack([x, y]), ddof=1)
        pairs.append(pair_digest(job, low, high, n, x.mean(), y.mean(), cov[0, 0], cov[1, 1], cov[0, 1], lambda x=x, y=y: (x, y)))
        if job.get("portfolios"):
            excess = np.vstack([cols[name] - rf for name in job["portfolios"]])
            weights = job.get("marketWeights") or [1.0] * len(job["portfolios"])
            pairs[-1]["values"].update(factor_digest(excess, weights, n))
    write_digest(job, "numpy", pairs)


def roll(job):
    (low, high), = job["pairs"]
    cols, dates = load(job, used_names(job), with_dates=True)
    rf = cols[job["rf"]] if job.get("rf") else 0.0
    x, y = cols[low] - rf, cols[high] - rf
    k, step, n = job["window"], job["step"], len(x)
    ends = np.arange(n - 1, k - 2, -step)[::-1]
    cx, cy = x.mean(), y.mean()
    xc, yc = x - cx, y - cy

    def window_sum(z):
        cs = np.concatenate(([0.0], np.cumsum(z)))
        return cs[ends + 1] - cs[ends + 1 - k]

    sx, sy = window_sum(xc), window_sum(yc)
    mx, my = sx / k, sy / k
    vl = (window_sum(xc * xc) - k * mx * mx) / (k - 1)
    vh = (window_sum(yc * yc) - k * my * my) / (k - 1)
    c = (window_sum(xc * yc) - k * mx * my) / (k - 1)
    out = columns(NumpyOps(), job["weight"], k, cx + mx, cy + my, vl, vh, c)
    matrix = np.column_stack([out[name] for name in ROLL_COLUMNS]).tolist()
    starts, finish = dates[ends + 1 - k].tolist(), dates[ends].tolist()
    fmt = "%s,%s,%d," + ",".join(["%r"] * len(ROLL_COLUMNS)) + "\n"
    with open(job["out"], "w") as f:
        f.write("start,end,observations," + ",".join(ROLL_COLUMNS) + "\n")
        for first in range(0, len(ends), 100_000):
            rows = matrix[first : first + 100_000]
            f.write("".join([fmt % (starts[first + i], finish[first + i], k, *row) for i, row in enumerate(rows)]))


if __name__ == "__main__":
    job = read_job()
    {"solve": solve, "roll": roll}[job["job"]](job)
    sys.exit(0)
