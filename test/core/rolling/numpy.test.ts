/**
 * rollSolve against an independent numpy implementation (source: test/fixtures/rolling/generate_rolling.py,
 * output test/fixtures/rolling/rolling_expected.json): 400 rows of a one-factor model with a
 * time-varying risk-free rate; every window of a 63-row window every 21 rows (w = 0.5) and of an
 * expanding window from 100 rows every 150 rows (w = 0.3).
 *
 * numpy computes each window from its rows: np.mean, np.cov (ddof = 1), OLS by np.linalg.lstsq with
 * classical standard errors from s^2 (X'X)^-1, and the closed forms of the set and the landmarks.
 * Tolerance 1e-10 relative, as for solve's numpy test (test/core/solve.numpy.test.ts): different
 * algorithms on the same float64 inputs agree to ~1e-13 on these data; an alpha gets the absolute
 * floor 1e-10 (|y-bar| + |beta x-bar|) because y-bar - beta x-bar cancels.
 */

import { readFileSync } from "node:fs";
import { describe, expect, test } from "vitest";
import { rollSolve, type WindowSpec } from "../../../src/core/rolling/index.js";
import { landmarkNames } from "../../../src/core/types.js";
import { Mismatches } from "./helpers.js";

interface ExpectedLine {
  alpha: number;
  beta: number;
  alphaStdErr: number;
  betaStdErr: number;
  rSquared: number;
  residualVariance: number;
}
interface ExpectedWindow {
  start: number;
  end: number;
  observations: number;
  summary: { lowMean: number; highMean: number; lowVariance: number; highVariance: number; covariance: number };
  market: { mean: number; variance: number };
  capm: { low: ExpectedLine; high: ExpectedLine };
  bounds: Record<"lowBeta" | "highBeta" | "factorVariance", { min: number; max: number }>;
  landmarkLowBetas: Record<(typeof landmarkNames)[number], number | null>;
}
const fixture = JSON.parse(readFileSync(new URL("../../fixtures/rolling/rolling_expected.json", import.meta.url), "utf8")) as {
  source: string;
  data: { low: number[]; high: number[]; riskFree: number[] };
  cases: { spec: WindowSpec; weight: number; windows: ExpectedWindow[] }[];
};

const rel = 1e-10;

describe.each(fixture.cases.map((c) => ({ label: `${c.spec.kind}, w = ${c.weight}`, c })))(
  "rollSolve on the numpy fixture ($label)",
  ({ c }) => {
    // generate_rolling.py enumerates windows from row 0: the "start" alignment.
    const windows = rollSolve(fixture.data.low, fixture.data.high, fixture.data.riskFree, c.weight, { ...c.spec, align: "start" });

    test("reports the windows numpy enumerates, with their rows and counts (generate_rolling.py)", () => {
      expect(windows.map((w) => [w.start, w.end, w.observations])).toEqual(c.windows.map((e) => [e.start, e.end, e.observations]));
    });

    test("moments, CAPM fits, bounds and landmark betas of each window match numpy to 1e-10 (generate_rolling.py)", () => {
      const bad = new Mismatches();
      c.windows.forEach((e, i) => {
        const w = windows[i]!;
        const at = `[${e.start}, ${e.end}]`;
        for (const key of ["lowMean", "highMean", "lowVariance", "highVariance", "covariance"] as const)
          bad.check(`${at} ${key}`, w.summary[key], e.summary[key], rel);
        bad.check(`${at} market mean`, w.market.mean, e.market.mean, rel);
        bad.check(`${at} market variance`, w.market.variance, e.market.variance, rel);
        for (const book of ["low", "high"] as const) {
          const a = w.capm?.[book];
          const x = e.capm[book];
          const ybar = book === "low" ? e.summary.lowMean : e.summary.highMean;
          bad.check(`${at} ${book} alpha`, a?.alpha, x.alpha, rel, rel * (Math.abs(ybar) + Math.abs(x.beta * e.market.mean)));
          for (const key of ["beta", "alphaStdErr", "betaStdErr", "rSquared", "residualVariance"] as const)
            bad.check(`${at} ${book} ${key}`, a?.[key], x[key], rel);
        }
        for (const key of ["lowBeta", "highBeta", "factorVariance"] as const) {
          bad.check(`${at} bounds.${key}.min`, w.bounds?.[key].min, e.bounds[key].min, rel);
          bad.check(`${at} bounds.${key}.max`, w.bounds?.[key].max, e.bounds[key].max, rel);
        }
        for (const name of landmarkNames) {
          const expected = e.landmarkLowBetas[name];
          const actual = w.landmarks?.[name]?.lowBeta ?? null;
          if (expected === null || actual === null) {
            if (expected !== actual) bad.list.push(`${at} ${name}: ${actual} vs numpy ${expected}`);
          } else bad.check(`${at} ${name}.lowBeta`, actual, expected, rel);
        }
      });
      expect(bad.head()).toEqual([]);
    });
  },
);
