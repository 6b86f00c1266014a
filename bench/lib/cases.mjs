// The benchmark's cases: our command line as a user types it, the job every peer does, and how the
// two outputs are compared. `ours` gets the output path; `variants` are further runs of ours (e.g.
// --threads 1) timed in the same rounds.

const weight = 0.5;
const lows = Array.from({ length: 25 }, (_, i) => `l${String(i + 1).padStart(2, "0")}`);
const highs = Array.from({ length: 8 }, (_, i) => `h${String(i + 1).padStart(2, "0")}`);

/** Relative tolerance 1e-10 for every deterministic number (see tolerance notes in RESULTS). */
export const exact = 1e-10;

/**
 * Tolerances by JSON path for solve. Deterministic numbers: 1e-10 relative; the market's mean and
 * Sharpe ratio, which can be near 0 against their spread, with a floor (1e-10 of the returns' scale).
 * Bootstrap summaries: Monte Carlo agreement only (the generators differ): standard errors within 5%
 * (about 5 standard errors of the difference of two estimates from 10,000 replicates each), the
 * bounds' percentile limits within 0.5%; the return-implied beta (a ratio of means with a heavy tail)
 * and the other percentile limits are not compared.
 */
export function solveTolerance(path) {
  if (path.startsWith("uncertainty.bootstrap.")) {
    if (path === "uncertainty.bootstrap.blockLength") return exact;
    if (path.includes("returnImplied")) return null;
    if (path.startsWith("uncertainty.bootstrap.stdErrors.")) return 0.05;
    if (/intervals\.(low|high)Beta(Min|Max)\./.test(path)) return 0.005;
    return null;
  }
  if (path === "moments.market.mean" || path.endsWith(".mean")) return { relative: exact, floor: 1e-3 };
  if (path.endsWith("sharpeRatio") || path.endsWith("Alpha") || path.endsWith(".alpha")) return { relative: exact, floor: 1e-1 };
  return exact;
}

/**
 * Tolerances by column for roll. The peers form window moments differently from ours (numpy from
 * cumulative sums of the centred series, polars and DuckDB with their rolling/windowed aggregates), so
 * a window's variances carry their sums' rounding: relative 1e-8 for everything, with floors for the
 * numbers near 0 (means and alphas: 1e-3 of a daily return's scale, i.e. 1e-11 absolute at 1e-8).
 */
export function rollTolerance(name) {
  if (/Mean$|Alpha$/.test(name)) return { relative: 1e-8, floor: 1e-3 };
  return 1e-8;
}

/** Every case, in order. `data` names a data set of data.mjs; `job` is what the peers get. */
export function buildCases() {
  const solve = (file, more) => ["solve", file, "--low", "low", "--high", "high", ...more];
  const cases = [];
  const add = (c) => cases.push({ peers: ["numpy", "polars", "duckdb"], variants: [], ...c });
  for (const uncertainty of [false, true]) {
    add({
      id: uncertainty ? "a2" : "a1",
      title: `solve, 2,520 daily rows${uncertainty ? ", default uncertainty (HAC, delta method)" : ", --no-uncertainty"}`,
      data: "daily2520",
      kind: "solve",
      ours: (file, out) => solve(file, ["--rf", "rf", "--format", "json", ...(uncertainty ? [] : ["--no-uncertainty"]), "--output", out]),
      job: { job: "solve", pairs: [["low", "high"]], rf: "rf", uncertainty },
    });
  }
  for (const uncertainty of [false, true]) {
    add({
      id: uncertainty ? "b2" : "b1",
      title: `solve, 1,000,000 daily rows${uncertainty ? ", default uncertainty (HAC, delta method)" : ", --no-uncertainty"}`,
      data: "daily1m",
      kind: "solve",
      scaling: uncertainty,
      ours: (file, out) => solve(file, ["--rf", "rf", "--format", "json", ...(uncertainty ? [] : ["--no-uncertainty"]), "--output", out]),
      job: { job: "solve", pairs: [["low", "high"]], rf: "rf", uncertainty },
    });
  }
  add({
    id: "c",
    title: "solve --bootstrap 10000, 2,520 daily rows (automatic block length; default uncertainty)",
    data: "daily2520",
    kind: "solve",
    ours: (file, out) => solve(file, ["--rf", "rf", "--format", "json", "--bootstrap", "10000", "--output", out]),
    variants: [{ label: "--threads 1", args: ["--threads", "1"] }],
    peers: ["numpy"],
    peerNote: "polars and DuckDB have no resampling of their own: the bootstrap peer is numpy alone",
    job: { job: "solve", pairs: [["low", "high"]], rf: "rf", uncertainty: true, bootstrap: 10000, seed: 1 },
  });
  for (const step of [1, 21]) {
    add({
      id: step === 1 ? "d1" : "d2",
      title: `roll --window 252${step === 1 ? "" : " --step 21"}, 1,000,000 daily rows, CSV${step === 1 ? " of every window" : ""}`,
      data: "daily1m",
      kind: "roll",
      ours: (file, out) => [
        "roll",
        file,
        "--low",
        "low",
        "--high",
        "high",
        "--rf",
        "rf",
        "--window",
        "252",
        ...(step === 1 ? [] : ["--step", "21"]),
        "--format",
        "csv",
        "--output",
        out,
      ],
      job: { job: "roll", pairs: [["low", "high"]], rf: "rf", window: 252, step },
    });
  }
  add({
    id: "e",
    title: "solve, 200 pairs (--lows 25 x --highs 8) of one 50-column file, 2,520 rows, JSON Lines, default uncertainty",
    data: "wide50",
    kind: "batch",
    ours: (file, out) => ["solve", file, "--lows", lows.join(","), "--highs", highs.join(","), "--format", "jsonl", "--output", out],
    job: { job: "solve", pairs: lows.flatMap((l) => highs.map((h) => [l, h])), rf: null, uncertainty: true },
  });
  for (const uncertainty of [false, true]) {
    add({
      id: uncertainty ? "f2" : "f1",
      title: `solve, 10,000,000 minute rows (date-time stamps)${uncertainty ? ", default uncertainty" : ", --no-uncertainty"}`,
      data: "minutes10m",
      kind: "solve",
      scaling: uncertainty,
      ours: (file, out) => solve(file, ["--format", "json", ...(uncertainty ? [] : ["--no-uncertainty"]), "--output", out]),
      job: { job: "solve", pairs: [["low", "high"]], rf: null, uncertainty },
    });
  }
  const portfolios = Array.from({ length: 10 }, (_, i) => `P${i + 1}`);
  add({
    id: "g",
    title: "solve --portfolios P1..P10 (the k = 10 factor model), 10,000 daily rows, default uncertainty",
    data: "factor10",
    kind: "solve",
    ours: (file, out) => [
      "solve",
      file,
      "--low",
      "P1",
      "--high",
      "P10",
      "--rf",
      "rf",
      "--portfolios",
      portfolios.join(","),
      "--format",
      "json",
      "--output",
      out,
    ],
    peers: ["numpy"],
    peerNote:
      "the factor model's peer is numpy alone (its maximum-likelihood fit by numpy.linalg.eigh, bench/peers/factor.py; polars and DuckDB have no eigen solver)",
    job: { job: "solve", pairs: [["P1", "P10"]], rf: "rf", uncertainty: true, portfolios },
  });
  // Time per row at default settings from 1e4 to 1e7 rows: s1, s2, b2 (1e6) and f2 (1e7: daily dates
  // end at the year 9999 before 10 million rows, so the 1e7 point is the minute-stamp file). The fixed
  // cost is ours on the first 300 rows of the same data, timed in the same rounds (run.mjs).
  for (const [id, data, rows] of [
    ["s1", "daily10k", "10,000"],
    ["s2", "daily100k", "100,000"],
  ]) {
    add({
      id,
      title: `solve, ${rows} daily rows, default uncertainty (time per row)`,
      data,
      kind: "solve",
      scaling: true,
      ours: (file, out) => solve(file, ["--rf", "rf", "--format", "json", "--output", out]),
      job: { job: "solve", pairs: [["low", "high"]], rf: "rf", uncertainty: true },
    });
  }
  // periodsPerYear: what our frequency detection finds in the data's dates (the peers read no dates):
  // business days 252, minute stamps none (nothing annualised; docs/methods.md §24).
  for (const c of cases) {
    const minutes = c.data === "minutes10m";
    c.job = { weight, dateColumn: minutes ? "time" : "date", step: 1, periodsPerYear: minutes ? null : 252, ...c.job };
  }
  return cases;
}
