"""DuckDB peer: read_csv (multi-threaded) in SQL, the moments as SQL aggregates (avg, var_samp,
covar_samp), for roll the same aggregates over a window frame (ROWS BETWEEN k - 1 PRECEDING AND CURRENT
ROW) with the closed forms of formulas.py generated as SQL expressions and COPY ... TO a CSV file; the
uncertainty in numpy on the columns DuckDB read."""

import sys

import duckdb

from common import pair_digest, read_job, write_digest
from formulas import ROLL_COLUMNS, columns


class Sql:
    """A SQL expression that composes with Python's arithmetic operators."""

    def __init__(self, text):
        self.text = text

    @staticmethod
    def of(a):
        if isinstance(a, Sql):
            return a.text
        if a != a:
            return "NULL"
        return repr(float(a)) if isinstance(a, float) else f"{a}::DOUBLE"

    def _bin(self, op, other, swap=False):
        a, b = (Sql.of(other), self.text) if swap else (self.text, Sql.of(other))
        return Sql(f"({a} {op} {b})")

    __add__ = lambda s, o: s._bin("+", o)  # noqa: E731
    __radd__ = lambda s, o: s._bin("+", o, True)  # noqa: E731
    __sub__ = lambda s, o: s._bin("-", o)  # noqa: E731
    __rsub__ = lambda s, o: s._bin("-", o, True)  # noqa: E731
    __mul__ = lambda s, o: s._bin("*", o)  # noqa: E731
    __rmul__ = lambda s, o: s._bin("*", o, True)  # noqa: E731
    __truediv__ = lambda s, o: s._bin("/", o)  # noqa: E731
    __rtruediv__ = lambda s, o: s._bin("/", o, True)  # noqa: E731
    __gt__ = lambda s, o: s._bin(">", o)  # noqa: E731
    __lt__ = lambda s, o: s._bin("<", o)  # noqa: E731
    __ge__ = lambda s, o: s._bin(">=", o)  # noqa: E731


class SqlOps:
    nan = float("nan")

    def maximum(self, a, b):
        return Sql(f"greatest({Sql.of(a)}, {Sql.of(b)})")

    def minimum(self, a, b):
        return Sql(f"least({Sql.of(a)}, {Sql.of(b)})")

    def sqrt(self, a):
        return Sql(f"sqrt({Sql.of(a)})")

    def abs(self, a):
        return Sql(f"abs({Sql.of(a)})")

    def where(self, cond, a, b):
        return Sql(f"(CASE WHEN {Sql.of(cond)} THEN {Sql.of(a)} ELSE {Sql.of(b)} END)")

    def both(self, a, b):
        return Sql(f"({Sql.of(a)} AND {Sql.of(b)})")


def q(name):
    return '"' + name.replace('"', '""') + '"'


def excess(job, name):
    return f"({q(name)} - {q(job['rf'])})" if job.get("rf") else q(name)



def solve(job):
    con = duckdb.connect()
    path = job["file"].replace("'", "''")
    aggregates = []
    for low, high in job["pairs"]:
        x, y = excess(job, low), excess(job, high)
        aggregates += [f"avg({x})", f"avg({y})", f"var_samp({x})", f"var_samp({y})", f"covar_samp({x}, {y})"]
    if job.get("uncertainty"):
        names = sorted({n for pair in job["pairs"] for n in pair} | ({job["rf"]} if job.get("rf") else set()))
        con.execute(f"CREATE TEMP TABLE t AS SELECT {', '.join(q(n) for n in names)} FROM read_csv('{path}', header = true)")
        relation = "t"
    else:
        relation = f"read_csv('{path}', header = true)"
    row = con.execute(f"SELECT count(*), {', '.join(aggregates)} FROM {relation}").fetchone()
    n = row[0]
    arrays = con.execute("SELECT * FROM t").fetchnumpy() if job.get("uncertainty") else None
    rf = arrays[job["rf"]] if arrays is not None and job.get("rf") else 0.0
    pairs = []
    for i, (low, high) in enumerate(job["pairs"]):
        ml, mh, vl, vh, c = row[1 + 5 * i : 6 + 5 * i]
        get = lambda low=low, high=high: (arrays[low] - rf, arrays[high] - rf)  # noqa: E731
        pairs.append(pair_digest(job, low, high, n, ml, mh, vl, vh, c, get))
    write_digest(job, "duckdb", pairs)


def roll(job):
    (low, high), = job["pairs"]
    k, step = job["window"], job["step"]
    path = job["file"].replace("'", "''")
    out_path = job["out"].replace("'", "''")
    x, y = excess(job, low), excess(job, high)
    frame = f"(ORDER BY rn ROWS BETWEEN {k - 1} PRECEDING AND CURRENT ROW)"
    out = columns(SqlOps(), job["weight"], k, Sql("ml"), Sql("mh"), Sql("vl"), Sql("vh"), Sql("c"))
    select = ", ".join(f"{Sql.of(out[c])} AS {c}" for c in ROLL_COLUMNS)
    con = duckdb.connect()
    con.execute(f"""
COPY (
  WITH src AS (SELECT row_number() OVER (ORDER BY {q(job["dateColumn"])}) - 1 AS rn, * FROM read_csv('{path}', header = true)),
  win AS (
    SELECT rn, lag({q(job['dateColumn'])}, {k - 1}) OVER (ORDER BY rn) AS "start", {q(job['dateColumn'])} AS "end",
      avg({x}) OVER w AS ml, avg({y}) OVER w AS mh, var_samp({x}) OVER w AS vl, var_samp({y}) OVER w AS vh,
      covar_samp({x}, {y}) OVER w AS c, count(*) OVER () AS n
    FROM src WINDOW w AS {frame}
  )
  SELECT "start", "end", {k} AS observations, {select} FROM win
  WHERE rn >= {k - 1} AND (n - 1 - rn) % {step} = 0 ORDER BY rn
) TO '{out_path}' (HEADER, DELIMITER ',')""")


if __name__ == "__main__":
    job = read_job()
    {"solve": solve, "roll": roll}[job["job"]](job)
    sys.exit(0)
