/**
 * assessUncertainty: how its parts fit together, its defaults and its output contract.
 * Expected values come from independent code (solve's identified set), from published formulas
 * (White's 1980 HC0 covariance, to which HAC reduces at lag 0; the affine map b_high = (1 - w b)/(1 - w)
 * of docs/methods.md §1), from scipy (z_0.975 = 1.959963984540054) or from Kiefer & Vogelsang (2005),
 * whose fixed-b critical value for the Bartlett kernel at b = S/T and the two-sided 5% level is
 * 1.9600 + 2.9694 b + 0.4160 b^2 - 0.5324 b^3. The statistical methods themselves are checked against
 * their references in the other files of this folder.
 */

import { describe, expect, test } from "vitest";
import {
  assessUncertainty as assessChecked,
  automaticBandwidths,
  hacKernels,
  imbensManskiCriticalValue,
  intervalMethods,
  intervalSources,
  longRunMethods,
} from "../../../src/core/inference/index.js";
import { inverse } from "../../../src/core/numerics/linearAlgebra.js";
import { drawSample } from "../../../src/core/forward/simulate.js";
import { solve, solveKeepingMoments } from "../../../src/core/solve.js";
import { expectClose } from "../../support/close.js";
import { codes, ok } from "../helpers.js";

const assessUncertainty = (...args: Parameters<typeof assessChecked>) => ok(assessChecked(...args));

const w = 0.4;
const sample = drawSample(
  { lowBeta: 0.8, weight: w, factorVol: 0.012, factorMean: 0.0005, lowNoiseVol: 0.005, highNoiseVol: 0.006 },
  { periods: 600, seed: 17, noiseAr: 0.2 },
);
const input = { low: sample.low, high: sample.high, riskFree: 0.0001 };
const result = assessUncertainty(input, { weight: w });
const z975 = 1.959963984540054;
/** The default bandwidth of the bounds, 6 sqrt(T) (docs/methods.md §4), as a share of T = 600. */
const bDefault = (6 * Math.sqrt(600)) / 600;
const kieferVogelsang975 = 1.96 + 2.9694 * bDefault + 0.416 * bDefault ** 2 - 0.5324 * bDefault ** 3;

describe("the bounds", () => {
  test("their estimates are solve()'s identified set", () => {
    const solved = solve(input, { weight: w });
    if (!solved.ok || solved.value.bounds === null) expect.fail("solve found no set");
    expectClose(result.bounds?.lowBeta.min.estimate, solved.value.bounds.lowBeta.min, { rel: 1e-12 });
    expectClose(result.bounds?.lowBeta.max.estimate, solved.value.bounds.lowBeta.max, { rel: 1e-12 });
    expectClose(result.bounds?.highBeta.min.estimate, solved.value.bounds.highBeta.min, { rel: 1e-12 });
    expectClose(result.bounds?.highBeta.max.estimate, solved.value.bounds.highBeta.max, { rel: 1e-12 });
  });

  test("by default pointwise limits are estimate -/+ the fixed-b critical value (Kiefer-Vogelsang 2005) times se", () => {
    expect(result.method.bandwidth).toBeCloseTo(6 * Math.sqrt(600), 12);
    expect(result.method.lags).toBe(Math.ceil(6 * Math.sqrt(600)) - 1);
    for (const end of [result.bounds!.lowBeta.min, result.bounds!.lowBeta.max]) {
      // The code's quantile matches the published polynomial by construction, to the root finder's tolerance.
      expectClose(end.lower, end.estimate - kieferVogelsang975 * end.stdError, { rel: 1e-9 });
      expectClose(end.upper, end.estimate + kieferVogelsang975 * end.stdError, { rel: 1e-9 });
    }
  });

  test("with the iid long-run covariance pointwise limits are estimate -/+ z_0.975 se, z = 1.959963984540054 (scipy norm.ppf)", () => {
    const min = assessUncertainty(input, { weight: w, longRun: "iid" }).bounds!.lowBeta.min;
    expectClose(min.lower, min.estimate - z975 * min.stdError, { rel: 1e-14 });
    expectClose(min.upper, min.estimate + z975 * min.stdError, { rel: 1e-14 });
  });

  test("with bootstrap standard errors (block length b) the critical value is the fixed-b one at bandwidth 2b", () => {
    const boot = assessUncertainty(input, { weight: w, intervalSource: "bootstrap", bootstrap: { replicates: 100, blockLength: 5 } });
    const min = boot.bounds!.lowBeta.min;
    const b = (2 * 5) / 600;
    const critical = 1.96 + 2.9694 * b + 0.416 * b ** 2 - 0.5324 * b ** 3;
    expectClose(min.lower, min.estimate - critical * min.stdError, { rel: 1e-9 });
    expectClose(min.upper, min.estimate + critical * min.stdError, { rel: 1e-9 });
  });

  test("the high beta's standard errors are the low beta's times w/(1 - w), ends swapped", () => {
    const b = result.bounds!;
    expectClose(b.highBeta.min.stdError, (w / (1 - w)) * b.lowBeta.max.stdError, { rel: 1e-14 });
    expectClose(b.highBeta.max.stdError, (w / (1 - w)) * b.lowBeta.min.stdError, { rel: 1e-14 });
  });
});

describe("the intervals for the structural betas", () => {
  test("the default is Imbens-Manski on the delta-method bounds, their standard errors times the fixed-b factor", () => {
    const b = result.bounds!;
    const factor = kieferVogelsang975 / z975;
    const se = { lower: factor * b.lowBeta.min.stdError, upper: factor * b.lowBeta.max.stdError };
    const ratio = (b.lowBeta.max.estimate - b.lowBeta.min.estimate) / Math.max(se.lower, se.upper);
    const c = imbensManskiCriticalValue(ratio, 0.95);
    expect(result.lowBeta?.interval.method).toBe("imbens-manski");
    expectClose(result.lowBeta?.interval.lower, b.lowBeta.min.estimate - c * se.lower, { rel: 1e-9 });
    expectClose(result.lowBeta?.interval.upper, b.lowBeta.max.estimate + c * se.upper, { rel: 1e-9 });
    // The reported critical values multiply the reported standard errors.
    expectClose(result.lowBeta?.interval.criticalValue.lower, c * factor, { rel: 1e-9 });
  });

  test("the high beta's interval is the image of the low beta's under b_high = (1 - w b)/(1 - w)", () => {
    const h = (b: number) => (1 - w * b) / (1 - w);
    expectClose(result.highBeta?.interval.lower, h(result.lowBeta!.interval.upper), { rel: 1e-14 });
    expectClose(result.highBeta?.interval.upper, h(result.lowBeta!.interval.lower), { rel: 1e-14 });
  });

  test("Stoye's interval is never longer than Imbens-Manski's (it minimises the length; docs/methods.md §5.2)", () => {
    const stoye = assessUncertainty(input, { weight: w, interval: "stoye" }).lowBeta!.interval;
    const im = result.lowBeta!.interval;
    expect(stoye.method).toBe("stoye");
    expect(stoye.upper - stoye.lower).toBeLessThanOrEqual(im.upper - im.lower + 1e-9);
  });

  test("with intervalSource 'bootstrap' the bounds use the bootstrap standard errors", () => {
    const boot = assessUncertainty(input, {
      weight: w,
      intervalSource: "bootstrap",
      bootstrap: { replicates: 200, blockLength: 5, seed: 3 },
    });
    expect(boot.method.intervalSource).toBe("bootstrap");
    expect(boot.bounds?.lowBeta.min.stdError).toBe(boot.bootstrap?.stdErrors.lowBetaMin);
    expect(boot.bounds?.lowBeta.max.stdError).toBe(boot.bootstrap?.stdErrors.lowBetaMax);
    expect(boot.bounds?.correlation).toBe(boot.bootstrap?.boundsCorrelation);
    expect(boot.bootstrap?.replicates).toBe(200);
  });
});

describe("CAPM HAC standard errors", () => {
  test("defaults: Bartlett kernel, Newey-West 1994 lag (floor of the bandwidth), no prewhitening, no adjustment", () => {
    expect(result.capm.hac.kernel).toBe("bartlett");
    expect(result.capm.hac.prewhite).toBe(false);
    expect(result.capm.hac.adjust).toBe(false);
    expect(result.capm.hac.lags).toBe(Math.floor(result.capm.hac.bandwidth));
    expect(result.method).toMatchObject({ longRun: "hac", kernel: "bartlett", intervalSource: "delta" });
  });

  test("with lag 0 they are White's (1980) HC0 standard errors", () => {
    const lagZero = assessUncertainty(input, { weight: w, hac: { lags: 0 } });
    const y = Float64Array.from(sample.low, (v) => v - 0.0001);
    const x = Float64Array.from(sample.low, (v, t) => w * (v - 0.0001) + (1 - w) * (sample.high[t]! - 0.0001));
    const n = x.length;
    const xbar = x.reduce((s, v) => s + v, 0) / n;
    const ybar = y.reduce((s, v) => s + v, 0) / n;
    const beta = x.reduce((s, v, t) => s + (v - xbar) * (y[t]! - ybar), 0) / x.reduce((s, v) => s + (v - xbar) ** 2, 0);
    const e = y.map((v, t) => v - (ybar - beta * xbar) - beta * x[t]!);
    const sx = x.reduce((s, v) => s + v, 0);
    const sxx = x.reduce((s, v) => s + v * v, 0);
    const bread = inverse([
      [n, sx],
      [sx, sxx],
    ]);
    const meat = [
      [0, 0],
      [0, 0],
    ];
    for (let t = 0; t < n; t++) {
      const row = [1, x[t]!];
      for (let i = 0; i < 2; i++) for (let j = 0; j < 2; j++) meat[i]![j]! += row[i]! * row[j]! * e[t]! ** 2;
    }
    const v = (i: number) => [0, 1].reduce((s, k) => s + [0, 1].reduce((u, l) => u + bread[i]![k]! * meat[k]![l]! * bread[l]![i]!, 0), 0);
    expectClose(lagZero.capm.low.hac.alphaStdErr, Math.sqrt(v(0)), { rel: 1e-9 });
    expectClose(lagZero.capm.low.hac.betaStdErr, Math.sqrt(v(1)), { rel: 1e-9 });
  });
});

describe("contract", () => {
  test("option tuples list the accepted values (the CLI builds its choices from them)", () => {
    expect(hacKernels).toEqual(["bartlett", "quadratic-spectral"]);
    expect(automaticBandwidths).toEqual(["auto", "newey-west-1994", "andrews-1991"]);
    expect(longRunMethods).toEqual(["hac", "iid"]);
    expect(intervalMethods).toEqual(["imbens-manski", "stoye"]);
    expect(intervalSources).toEqual(["delta", "bootstrap"]);
  });

  test("the bootstrap is off unless replicates > 0; iid Omega reports no kernel", () => {
    expect(result.bootstrap).toBeNull();
    expect(assessUncertainty(input, { weight: w, longRun: "iid" }).method).toMatchObject({
      longRun: "iid",
      kernel: null,
      bandwidth: null,
      lags: null,
    });
  });

  test("no identified set (covariance <= 0) gives null bounds and intervals, other fields still computed", () => {
    const negative = { low: Float64Array.from(sample.low), high: Float64Array.from(sample.low, (v, t) => -v + 0.001 * Math.sin(t)) };
    const r = assessUncertainty(negative);
    expect(r.bounds).toBeNull();
    expect(r.lowBeta).toBeNull();
    expect(r.highBeta).toBeNull();
    expect(r.sharpe.low.estimate).toBeTypeOf("number");
  });

  test("invalid requests are refused with diagnostics: a confidence outside its range; bootstrap standard errors without a bootstrap", () => {
    const refused = (options: Parameters<typeof assessChecked>[1]) => {
      const r = assessChecked(input, options);
      return r.ok ? [] : codes(r.issues);
    };
    expect(refused({ confidence: 1 })).toEqual(["invalid-argument"]);
    expect(refused({ confidence: 0.4 })).toEqual(["invalid-argument"]);
    expect(refused({ intervalSource: "bootstrap" })).toEqual(["invalid-argument"]);
  });
});

describe("assessUncertainty with the moments solve formed", () => {
  // A risk-free series and returns in percent: solve and the uncertainty scale them by a power of two other than 1.
  const inPercent = {
    low: sample.low.map((x) => x * 100),
    high: sample.high.map((x) => x * 100),
    riskFree: sample.low.map((_, t) => 0.01 * (1 + (t % 3))),
  };
  const cases = [
    ["decimal, one risk-free rate", input, w],
    ["percent, a risk-free series", inPercent, w],
    ["percent, weight 0.7", inPercent, 0.7],
  ] as const;

  test.each(cases)("gives what its own pass over the rows gives, bit for bit (%s)", (_, data, weight) => {
    const solved = solveKeepingMoments(data, { weight });
    if (!solved.ok) throw new Error("solve failed");
    // A power of two other than 1 where the returns are in percent: the reuse must keep the scale's bits.
    if (data === inPercent) expect(solved.value.moments.scale).not.toBe(1);
    const own = assessUncertainty(data, { weight });
    expect(assessUncertainty(data, { weight, solved: solved.value.moments })).toStrictEqual(own);
  });

  test("ignores moments formed for another sample or another weight", () => {
    const other = solveKeepingMoments({ ...input, low: input.low.map((x) => x * 1.5) }, { weight: w });
    const otherWeight = solveKeepingMoments(input, { weight: 0.3 });
    if (!other.ok || !otherWeight.ok) throw new Error("solve failed");
    expect(assessUncertainty(input, { weight: w, solved: other.value.moments })).toStrictEqual(result);
    expect(assessUncertainty(input, { weight: w, solved: otherWeight.value.moments })).toStrictEqual(result);
  });

  test("uses the moments it is given for its sample and weight (no pass of its own then)", () => {
    const solved = solveKeepingMoments(input, { weight: w });
    if (!solved.ok) throw new Error("solve failed");
    const { moments } = solved.value;
    const sums = moments.crossProducts.sums;
    // The same sample and weight with the covariance moved: the bounds' delta method reads it.
    const moved = {
      ...moments,
      crossProducts: {
        ...moments.crossProducts,
        sums: [[sums[0]![0]!, sums[0]![1]! * 0.9, sums[0]![2]!], [sums[1]![0]! * 0.9, sums[1]![1]!, sums[1]![2]!], sums[2]!],
      },
    };
    const reused = assessUncertainty(input, { weight: w, solved: moved });
    expect(reused.bounds?.lowBeta.min.stdError).toBeGreaterThan(0);
    expect(reused.bounds?.lowBeta.min.stdError).not.toBe(result.bounds?.lowBeta.min.stdError);
  });
});
