/**
 * The memo of books' Sharpe ratios (sharpeMemo.ts): a book met again with the same rates, scale and
 * HAC options takes its numbers, bit for bit what computing them again gives; anything else differing
 * computes them anew. The numbers themselves are checked against published values in sharpe.test.ts.
 */
import { describe, expect, it, vi } from "vitest";
import type { SharpeStdErrors } from "../../../src/core/inference/sharpe.js";
import { SharpeMemo } from "../../../src/core/inference/sharpeMemo.js";
import { assessUncertainty } from "../../../src/core/inference/uncertainty.js";
import { createRandom } from "../../../src/core/numerics/rng.js";
import { solveJob, sourcesFrom } from "../../../src/jobs/index.js";

const result = (estimate: number): SharpeStdErrors => ({ estimate, iidStdErr: 0, mertensStdErr: 0, hacStdErr: 0 });

describe("the memo's keys", () => {
  const book = Float64Array.of(0.01, -0.02, 0.03);
  const rates = Float64Array.of(0.001, 0.001, 0.001);

  it("computes a book once for the same series, rates, scale and HAC options", () => {
    const memo = new SharpeMemo();
    const compute = vi.fn(() => result(1));
    const first = memo.of(book, rates, 32, { kernel: "bartlett" }, compute);
    const again = memo.of(book, rates, 32, { kernel: "bartlett" }, compute);
    expect(again).toBe(first);
    expect(compute).toHaveBeenCalledTimes(1);
    expect(memo.computed).toBe(1);
  });

  it("computes anew for another array with the same numbers, other rates, another scale or other HAC options", () => {
    const memo = new SharpeMemo();
    let calls = 0;
    const compute = () => result(++calls);
    memo.of(book, rates, 32, {}, compute);
    memo.of(Float64Array.from(book), rates, 32, {}, compute);
    memo.of(book, Float64Array.from(rates), 32, {}, compute);
    memo.of(book, 0.001, 32, {}, compute);
    memo.of(book, undefined, 32, {}, compute);
    memo.of(book, rates, 64, {}, compute);
    memo.of(book, rates, 32, { lags: 3 }, compute);
    expect(calls).toBe(7);
  });

  it("tells a rate of -0 from 0 (x - 0 and x - -0 differ at x = -0)", () => {
    const memo = new SharpeMemo();
    let calls = 0;
    const compute = () => result(++calls);
    expect(memo.of(book, 0, 1, {}, compute).estimate).toBe(1);
    expect(memo.of(book, -0, 1, {}, compute).estimate).toBe(2);
    expect(memo.of(book, 0, 1, {}, compute).estimate).toBe(1);
  });
});

/** Books of a one-factor model on `n` rows. */
function books(n: number, seed: number, count: number): Float64Array[] {
  const random = createRandom(seed);
  const factor = Array.from({ length: n }, () => 0.01 * random.normal());
  return Array.from({ length: count }, (_, k) => Float64Array.from(factor, (f) => 0.0002 + (0.5 + 0.3 * k) * f + 0.004 * random.normal()));
}

describe("assessUncertainty with a memo", () => {
  it("gives every pair's Sharpe ratios bit for bit as without it, computing a shared book once", () => {
    const [low, highA] = books(400, 11, 2) as [Float64Array, Float64Array];
    // Another high book of the same magnitude (so the same scale for both pairs).
    const highB = Float64Array.from(highA).reverse();
    const memo = new SharpeMemo();
    for (const high of [highA, highB]) {
      const sample = { low, high, riskFree: 0.0001 };
      const alone = assessUncertainty(sample, { weight: 0.5 });
      const shared = assessUncertainty(sample, { weight: 0.5, sharpeMemo: memo });
      if (!alone.ok || !shared.ok) return expect.fail("assessUncertainty refused the sample");
      for (const side of ["low", "high", "market"] as const) {
        for (const [name, value] of Object.entries(alone.value.sharpe[side])) {
          expect(Object.is(shared.value.sharpe[side][name as keyof SharpeStdErrors], value), `${side} ${name}`).toBe(true);
        }
      }
    }
    // The low book twice (one scale: the books have the same magnitude), each high book once.
    expect(memo.computed).toBe(3);
  });
});

describe("a run of pairs that share books", () => {
  const [a, b, c, d] = books(300, 5, 4) as [Float64Array, Float64Array, Float64Array, Float64Array];
  const lines = ["date,A,B,C,D"];
  a.forEach((_, i) => {
    const date = new Date(Date.UTC(2020, 0, 1) + i * 86_400_000).toISOString().slice(0, 10);
    lines.push([date, ...[a, b, c, d].map((x) => x[i]!.toFixed(7))].join(","));
  });
  const read = sourcesFrom({ "books.csv": `${lines.join("\n")}\n` });

  it("takes shared books from the memo and reports each pair as a run of that pair alone", async () => {
    const of = vi.spyOn(SharpeMemo.prototype, "of");
    const run = await solveJob(["books.csv"], { lows: ["A", "B"], highs: ["C", "D"], rf: "0.0001" }, { read });
    const calls = of.mock.calls.length;
    const memos = new Set(of.mock.contexts as SharpeMemo[]);
    of.mockRestore();
    if (!run.ok) return expect.fail(run.issues.message);
    // Four pairs, two books each; four books, each computed once.
    expect(calls).toBe(8);
    expect([...memos].map((memo) => memo.computed)).toEqual([4]);
    for (const pair of run.value.pairs) {
      const alone = await solveJob(
        ["books.csv"],
        { low: pair.document.input.lowColumn, high: pair.document.input.highColumn, rf: "0.0001" },
        { read },
      );
      if (!alone.ok) return expect.fail(alone.issues.message);
      expect(JSON.stringify(pair.document)).toBe(JSON.stringify(alone.value.pairs[0]!.document));
    }
  });
});
