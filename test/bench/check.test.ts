// The benchmark's pure parts (bench/lib/check.mjs, cases.mjs): the helpers behind its figures and the
// agreement checks, which must fail on a mismatch. Expected values are worked by hand beside each check.
import { describe, expect, it } from "vitest";
import { bestPeer, compareDigest, median, ratio, relativeDifference, rollComparer } from "../../bench/lib/check.mjs";
import { buildCases, exact, rollTolerance, solveTolerance } from "../../bench/lib/cases.mjs";

describe("median, ratio, best peer", () => {
  it("takes the middle value, or the mean of the two middle values", () => {
    expect(median([0.3, 0.1, 0.2])).toBe(0.2);
    expect(median([4, 1, 3, 2])).toBe(2.5); // (2 + 3) / 2
    expect(() => median([])).toThrow(RangeError);
  });
  it("gives ours / theirs, null without a positive denominator", () => {
    expect(ratio(0.5, 2)).toBe(0.25);
    expect(ratio(1, 0)).toBeNull();
    expect(ratio(1, null)).toBeNull();
  });
  it("picks the smallest median and skips missing peers", () => {
    expect(bestPeer({ numpy: 0.5, polars: 0.25, duckdb: null })).toEqual({ name: "polars", median: 0.25 });
    expect(bestPeer({ numpy: null })).toBeNull();
  });
});

describe("relativeDifference", () => {
  it("is |a - b| / max(|a|, |b|, floor)", () => {
    expect(relativeDifference(1, 1.000001)).toBeCloseTo(1e-6 / 1.000001, 15);
    expect(relativeDifference(1e-20, 2e-20, 1e-3)).toBeCloseTo(1e-17, 25); // below the floor: absolute / floor
  });
  it("treats two undefined values as equal and one as a mismatch", () => {
    expect(relativeDifference(Number.NaN, null)).toBe(0);
    expect(relativeDifference(Number.NaN, 1)).toBe(Number.POSITIVE_INFINITY);
  });
});

describe("compareDigest", () => {
  const ours = { bounds: { lowBeta: { min: 0.62375891, max: 0.84418633 } }, observations: 2520 };
  it("passes numbers that agree to the tolerance", () => {
    const r = compareDigest(ours, { "bounds.lowBeta.min": 0.62375891 * (1 + 1e-13), observations: 2520 }, () => exact);
    expect(r.ok).toBe(true);
    expect(r.compared).toBe(2);
    expect(r.worstPath).toBe("bounds.lowBeta.min");
  });
  it("fails on a number off by more than the tolerance, naming it", () => {
    const r = compareDigest(ours, { "bounds.lowBeta.min": 0.6238, "bounds.lowBeta.max": 0.84418633 }, () => exact);
    expect(r.ok).toBe(false);
    expect(r.failures).toHaveLength(1);
    expect(r.failures[0]).toContain("bounds.lowBeta.min");
  });
  it("fails on a path our output lacks, and on an empty comparison", () => {
    expect(compareDigest(ours, { "bounds.highBeta.min": 1.2 }, () => exact).ok).toBe(false);
    expect(compareDigest(ours, {}, () => exact).ok).toBe(false);
  });
  it("skips paths whose tolerance is null", () => {
    const r = compareDigest(ours, { "bounds.lowBeta.min": 0.62375891, "uncertainty.bootstrap.x": 5 }, (p) =>
      p.startsWith("uncertainty") ? null : exact,
    );
    expect(r.ok).toBe(true);
    expect(r.compared).toBe(1);
  });
});

describe("rollComparer", () => {
  const ourHeader = "source,lowColumn,highColumn,start,end,observations,lowBeta,returnImpliedLowBeta";
  const ourRow = "f.csv,low,high,2000-01-03,2000-12-29,252,0.7062950647016747,";
  it("aligns columns by name, not by position (ours has three leading columns the peer lacks)", () => {
    const c = rollComparer(ourHeader, "start,end,observations,returnImpliedLowBeta,lowBeta", () => exact);
    c.row(ourRow, "2000-01-03,2000-12-29,252,nan,0.7062950647016747");
    const r = c.result(1, 1);
    expect(r.ok).toBe(true);
    expect(r.worst).toBe(0);
  });
  it("fails on a misaligned window (other dates), a differing number and a differing row count", () => {
    const peerHeader = "start,end,observations,lowBeta,returnImpliedLowBeta";
    const dates = rollComparer(ourHeader, peerHeader, () => exact);
    dates.row(ourRow, "2000-01-04,2001-01-02,252,0.7062950647016747,nan");
    expect(dates.result(1, 1).ok).toBe(false);
    const numbers = rollComparer(ourHeader, peerHeader, () => exact);
    numbers.row(ourRow, "2000-01-03,2000-12-29,252,0.7063,nan");
    const r = numbers.result(1, 1);
    expect(r.ok).toBe(false);
    expect(r.worstPath).toBe("lowBeta");
    const count = rollComparer(ourHeader, peerHeader, () => exact);
    count.row(ourRow, "2000-01-03,2000-12-29,252,0.7062950647016747,nan");
    expect(count.result(1, 2).ok).toBe(false);
  });
  it("fails when a peer's column is missing from ours, and when one side leaves a value undefined", () => {
    const missing = rollComparer(ourHeader, "start,end,lowAlpha", () => exact);
    missing.row(ourRow, "2000-01-03,2000-12-29,0.0003");
    expect(missing.result(1, 1).ok).toBe(false);
    const undefinedValue = rollComparer(ourHeader, "start,end,returnImpliedLowBeta", () => exact);
    undefinedValue.row(ourRow, "2000-01-03,2000-12-29,0.9");
    expect(undefinedValue.result(1, 1).ok).toBe(false);
  });
});

describe("cases", () => {
  it("covers every case of the benchmark with unique ids", () => {
    const ids = buildCases().map((c) => c.id);
    expect(ids).toEqual(["a1", "a2", "b1", "b2", "c", "d1", "d2", "e", "f1", "f2", "g", "s1", "s2"]);
  });
  it("compares the factor model's case in full, its factor model exactly", () => {
    const factor = buildCases().find((c) => c.id === "g")!;
    expect(factor.ours("in.csv", "out.json")).toContain("P1,P2,P3,P4,P5,P6,P7,P8,P9,P10");
    const tolerance = factor.tolerance ?? solveTolerance;
    expect(tolerance("uncertainty.method.lags")).toBe(exact);
    expect(tolerance("factorModel.portfolios.0.loading")).toBe(exact);
  });
  it("marks the default-settings cases from 1e4 to 1e7 rows for the time-per-row table", () => {
    const scaling = buildCases()
      .filter((c) => c.scaling)
      .map((c) => c.id);
    expect(scaling).toEqual(["b2", "f2", "s1", "s2"]);
  });
  it("runs the CLI with its real options and output file", () => {
    const byId = new Map(buildCases().map((c) => [c.id, c]));
    expect(byId.get("a1")!.ours("in.csv", "out.json")).toEqual(
      expect.arrayContaining(["solve", "in.csv", "--no-uncertainty", "--output", "out.json"]),
    );
    expect(byId.get("a2")!.ours("in.csv", "out.json")).not.toContain("--no-uncertainty");
    expect(byId.get("d2")!.ours("in.csv", "out.csv")).toEqual(expect.arrayContaining(["roll", "--window", "252", "--step", "21"]));
    expect(byId.get("e")!.job.pairs).toHaveLength(200); // 25 lows x 8 highs
    expect(byId.get("c")!.variants.map((v) => v.args)).toEqual([["--threads", "1"]]);
  });
  it("tells the peers the periods a year our frequency detection finds (the peers read no dates)", () => {
    const periods = new Map(buildCases().map((c) => [c.id, c.job.periodsPerYear]));
    // Business days are daily (252 periods a year); minute stamps are outside every band (docs/methods.md §24).
    for (const id of ["a1", "a2", "b2", "e", "g", "s1"]) expect(periods.get(id)).toBe(252);
    expect(periods.get("f1")).toBeNull();
    expect(periods.get("f2")).toBeNull();
  });
  it("holds deterministic numbers to 1e-10 and bootstrap summaries to Monte Carlo tolerances", () => {
    expect(solveTolerance("bounds.lowBeta.min")).toBe(1e-10);
    expect(solveTolerance("uncertainty.bootstrap.stdErrors.lowBetaMin")).toBe(0.05);
    expect(solveTolerance("uncertainty.bootstrap.stdErrors.returnImpliedLowBeta")).toBeNull();
    expect(rollTolerance("lowBeta")).toBe(1e-8);
  });
});
