/**
 * The identified set under correlated noise (docs/methods.md §2): the closed form of the ends against
 * the worked Example A, against a brute-force search in scipy (test/fixtures/models), and against the
 * structures the quadratic of §2 finds at single points.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { identifiedBounds } from "../../../src/core/identify.js";
import { correlatedNoiseSet, noiseStructuresAt } from "../../../src/core/models/correlatedNoise.js";
import { createRandom } from "../../../src/core/numerics/rng.js";
import { expectClose } from "../../support/close.js";

const fixture = JSON.parse(readFileSync(new URL("../../fixtures/models/models_expected.json", import.meta.url), "utf8")) as {
  correlatedNoise: {
    sets: {
      name: string;
      lowVariance: number;
      highVariance: number;
      covariance: number;
      weight: number;
      correlation: number;
      noiseCorrelation: number;
      interval: boolean;
      runs: number;
      min: number;
      max: number;
    }[];
    pointsExampleA: {
      noiseCorrelation: number;
      lowBeta: number;
      roots: { factorVariance: number; lowNoiseVariance: number; highNoiseVariance: number }[];
    }[];
  };
};

const exampleA = { weight: 0.5, lowMean: 0, highMean: 0, lowVariance: 4, highVariance: 9, covariance: 5 };
const setOf = (m: typeof exampleA, rho: number) => correlatedNoiseSet(m, rho, identifiedBounds(m));

describe("Example A (docs/methods.md §2 table: V_low 4, V_high 9, C 5, w 1/2, corr 5/6)", () => {
  // The table of docs/methods.md §2, six decimals (derived and checked numerically when it was written).
  const table: [number, number, number, [number, number, number]][] = [
    [-0.5, 0.714286, 0.888889, [5.588684, 0.856365, 0.267681]],
    [-0.3, 0.714286, 0.888889, [5.519113, 0.895499, 0.376385]],
    [0, 0.714286, 0.888889, [16 / 3, 1, 2 / 3]],
    [0.3, 0.709335, 0.894225, [4.929531, 1.227139, 1.297607]],
    [0.5, 0.697831, 0.906712, [4.343168, 1.556968, 2.2138]],
    [0.8, 0.615385, 1.0, [1.096078, 3.383456, 7.287378]],
  ];
  it.each(table)("rho %s: the set and the structure at b_low = 3/4", (rho, min, max, [phi, sl, sh]) => {
    const set = setOf(exampleA, rho);
    expect(set.kind).toBe(rho <= 0 ? "unchanged" : "wider");
    expect(Math.abs(set.bounds.lowBeta.min! - min)).toBeLessThan(1e-6);
    expect(Math.abs(set.bounds.lowBeta.max! - max)).toBeLessThan(1e-6);
    const [structure, ...others] = noiseStructuresAt(exampleA, rho, 0.75);
    expect(others).toEqual([]);
    expect(Math.abs(structure!.factorVariance - phi)).toBeLessThan(1e-6);
    expect(Math.abs(structure!.lowNoiseVariance - sl)).toBeLessThan(1e-6);
    expect(Math.abs(structure!.highNoiseVariance - sh)).toBeLessThan(1e-6);
  });

  it("gives exact ends at rho = 0.8: u1 = 2/3, so b_low from 8/13 to 1 (v = 13/6 in §2's closed form)", () => {
    const set = setOf(exampleA, 0.8);
    expectClose(set.bounds.lowBeta.min, 8 / 13, { rel: 1e-14 });
    expectClose(set.bounds.lowBeta.max, 1, { rel: 1e-14 });
    // b_high = (1 - w b_low)/(1 - w): 1 at b_low = 1 and 18/13 at 8/13.
    expectClose(set.bounds.highBeta.min, 1, { rel: 1e-14 });
    expectClose(set.bounds.highBeta.max, 18 / 13, { rel: 1e-14 });
  });

  it("keeps the uncorrelated set to the bit for rho <= 0, down to -1", () => {
    for (const rho of [-1, -0.999, -0.5, -1e-300, 0])
      expect(setOf(exampleA, rho).bounds.lowBeta).toEqual(identifiedBounds(exampleA).lowBeta);
  });

  it("reports no interval, with a diagnostic, from the observed correlation up to 1", () => {
    for (const rho of [5 / 6, 0.9, 1]) {
      const set = setOf(exampleA, rho);
      expect(set.kind).toBe("not-an-interval");
      expect(set.bounds).toEqual({ lowBeta: { min: null, max: null }, highBeta: { min: null, max: null } });
      expect(set.diagnostics.map((d) => [d.code, d.severity])).toEqual([["noise-correlation-not-an-interval", "warning"]]);
      expect(set.diagnostics[0]!.message).toContain("0.833333");
    }
  });

  it("reports no bounds when there is no set (a covariance that is not positive)", () => {
    const negative = { ...exampleA, covariance: -1 };
    const set = correlatedNoiseSet(negative, -0.5, null);
    expect(set.kind).toBe("no-set");
    expect(set.diagnostics.map((d) => d.code)).toEqual(["noise-correlation-no-set"]);
  });

  it("finds two structures outside [Lb, U] (b_low 0.9 > U = 8/9 at rho 0.5), as scipy's root search does", () => {
    const point = fixture.correlatedNoise.pointsExampleA.find((p) => p.lowBeta === 0.9)!;
    const found = noiseStructuresAt(exampleA, 0.5, 0.9);
    expect(found).toHaveLength(2);
    found.forEach((s, i) => {
      expectClose(s.factorVariance, point.roots[i]!.factorVariance, { rel: 1e-10 });
      expectClose(s.lowNoiseVariance, point.roots[i]!.lowNoiseVariance, { rel: 1e-8 });
    });
  });
});

describe("against a brute-force search (scipy, test/fixtures/models/generate_models.py)", () => {
  const sets = fixture.correlatedNoise.sets;
  it.each(sets.map((s) => [s.name, s.noiseCorrelation, s] as const))("%s, rho %s", (_name, rho, s) => {
    const m = {
      weight: s.weight,
      lowMean: 0,
      highMean: 0,
      lowVariance: s.lowVariance,
      highVariance: s.highVariance,
      covariance: s.covariance,
    };
    const set = setOf(m, rho);
    if (rho < s.correlation) {
      // The brute force bisects a membership test to about 1e-11 (its upper ends for rho < 0 stop 7e-12 short).
      expect(s.interval).toBe(true);
      expect(Math.abs(set.bounds.lowBeta.min! - s.min)).toBeLessThan(1e-9);
      expect(Math.abs(set.bounds.lowBeta.max! - s.max)).toBeLessThan(1e-9);
    } else {
      // At or above the observed correlation the brute force finds two runs, or one reaching both ends of (0, 1/w).
      expect(set.kind).toBe("not-an-interval");
      expect(s.runs > 1 || (s.min < 1e-3 && s.max > 1 / s.weight - 1e-3)).toBe(true);
    }
  });

  it("agrees with scipy's roots at b_low = 3/4", () => {
    for (const point of fixture.correlatedNoise.pointsExampleA.filter((p) => p.lowBeta === 0.75)) {
      const [found] = noiseStructuresAt(exampleA, point.noiseCorrelation, 0.75);
      expectClose(found!.factorVariance, point.roots[0]!.factorVariance, { rel: 1e-10 });
      expectClose(found!.highNoiseVariance, point.roots[0]!.highNoiseVariance, { rel: 1e-9 });
    }
  });
});

describe("the closed-form ends against the quadratic at single points", () => {
  it("finds a structure just inside each end and none just outside (200 random moment sets)", () => {
    const random = createRandom(20261215, 0);
    for (let k = 0; k < 200; k++) {
      const r = 0.05 + 0.9 * random.uniform();
      const rho = r * random.uniform();
      const weight = 0.1 + 0.8 * random.uniform();
      const lowVariance = 0.5 + random.uniform();
      const highVariance = 0.5 + 3 * random.uniform();
      const m = { weight, lowMean: 0, highMean: 0, lowVariance, highVariance, covariance: r * Math.sqrt(lowVariance * highVariance) };
      const { min, max } = setOf(m, rho).bounds.lowBeta;
      const width = max! - min!;
      const label = `r ${r}, rho ${rho}, w ${weight}`;
      for (const inside of [min! + 1e-6 * width, max! - 1e-6 * width, (min! + max!) / 2])
        expect(noiseStructuresAt(m, rho, inside).length, label).toBeGreaterThan(0);
      for (const outside of [min! - 1e-4 * width, max! + 1e-4 * width]) expect(noiseStructuresAt(m, rho, outside), label).toEqual([]);
      // Every structure found reproduces the covariance with correlated noise: C = b_l b_h phi + rho sqrt(s_l s_h).
      const b = (min! + max!) / 2;
      for (const s of noiseStructuresAt(m, rho, b)) {
        const bh = (1 - weight * b) / (1 - weight);
        expectClose(b * bh * s.factorVariance + rho * Math.sqrt(s.lowNoiseVariance * s.highNoiseVariance), m.covariance, { rel: 1e-9 });
      }
    }
  });
});
