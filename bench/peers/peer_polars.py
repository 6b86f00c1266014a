"""polars peer: polars.read_csv (multi-threaded) of the columns the job uses, the moments as polars
expressions (mean, var, cov), the closed forms of formulas.py as polars expressions for roll (rolling_mean,
rolling_var, rolling_cov over the window), the uncertainty in numpy on the columns polars read."""

import sys

import polars as pl

from common import pair_digest, read_job, write_digest
from formulas import ROLL_COLUMNS, columns


class PolarsOps:
    nan = float("nan")

    @staticmethod
    def _e(a):
        return a if isinstance(a, pl.Expr) else pl.lit(a)

    def maximum(self, a, b):
        return pl.max_horizontal(self._e(a), self._e(b))

    def minimum(self, a, b):
        return pl.min_horizontal(self._e(a), self._e(b))

    def sqrt(self, a):
        return self._e(a).sqrt()

    def abs(self, a):
        return self._e(a).abs()

    def where(self, cond, a, b):
        return pl.when(cond).then(a).otherwise(pl.lit(b))

    def both(self, a, b):
        return a & b


def used_names(job):
    names = []
    for pair in job["pairs"]:
        names += [n for n in pair if n not in names]
    if job.get("rf") and job["rf"] not in names:
        names.append(job["rf"])
    return names


def excess(job, name):
    return pl.col(name) - pl.col(job["rf"]) if job.get("rf") else pl.col(name)


def solve(job):
    df = pl.read_csv(job["file"], columns=used_names(job), schema_overrides={n: pl.Float64 for n in used_names(job)})
    exprs = []
    for i, (low, high) in enumerate(job["pairs"]):
        x, y = excess(job, low), excess(job, high)
        exprs += [x.mean().alias(f"ml{i}"), y.mean().alias(f"mh{i}"), x.var().alias(f"vl{i}"), y.var().alias(f"vh{i}"),
                  pl.cov(x, y).alias(f"c{i}")]  # fmt: skip
    row = df.select(exprs).row(0, named=True)
    n = df.height
    rf = df[job["rf"]].to_numpy() if job.get("rf") else 0.0
    pairs = []
    for i, (low, high) in enumerate(job["pairs"]):
        get = lambda low=low, high=high: (df[low].to_numpy() - rf, df[high].to_numpy() - rf)  # noqa: E731
        pairs.append(pair_digest(job, low, high, n, row[f"ml{i}"], row[f"mh{i}"], row[f"vl{i}"], row[f"vh{i}"], row[f"c{i}"], get))
    write_digest(job, "polars", pairs)


def roll(job):
    (low, high), = job["pairs"]
    date = job["dateColumn"]
    names = used_names(job)
    df = pl.read_csv(job["file"], columns=[date, *names], schema_overrides={n: pl.Float64 for n in names}, try_parse_dates=True)
    k, step, n = job["window"], job["step"], df.height
    x, y = excess(job, low), excess(job, high)
    moments = df.select(
        pl.col(date).shift(k - 1).alias("start"),
        pl.col(date).alias("end"),
        x.rolling_mean(k).alias("ml"),
        y.rolling_mean(k).alias("mh"),
        x.rolling_var(k).alias("vl"),
        y.rolling_var(k).alias("vh"),
        pl.rolling_cov(x, y, window_size=k).alias("c"),
    ).with_row_index("row")
    moments = moments.filter((pl.col("row") >= k - 1) & ((n - 1 - pl.col("row")) % step == 0))
    out = columns(PolarsOps(), job["weight"], k, pl.col("ml"), pl.col("mh"), pl.col("vl"), pl.col("vh"), pl.col("c"))
    table = moments.select(pl.col("start"), pl.col("end"), pl.lit(k).alias("observations"), *[out[c].alias(c) for c in ROLL_COLUMNS])
    table.write_csv(job["out"])


if __name__ == "__main__":
    job = read_job()
    {"solve": solve, "roll": roll}[job["job"]](job)
    sys.exit(0)
