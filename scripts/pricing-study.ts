/**
 * Monte Carlo size and power of the pricing test (src/core/pricing; docs/pricing-study.md).
 *
 * Samples come from the model (drawSample): R_i = b_i F + e_i, where "noise explains the alpha" holds
 * exactly (mean low = b_low lambda). At an end of the identified set (one book without noise) H0
 * holds at its boundary, where the test's rejection rate at 5% should be near 5%; inside the set it
 * should be below. Adding a constant alpha to the low book makes H0 false: the rejection rate is the
 * power. Each scenario: `--reps` samples (default 1000), seeds 300000 + rep, default settings of
 * `solve` (Bartlett kernel, Newey-West 1994 lag, 95%).
 *
 * Run (from the repository root):
 *   npx esbuild scripts/pricing-study.ts --bundle --platform=node --format=esm --outfile=/tmp/pricing-study.mjs && node /tmp/pricing-study.mjs
 */

import { drawSample, type SimulationOptions } from "../src/core/forward/simulate.js";
import type { Structure } from "../src/core/forward/populationMoments.js";
import { identifiedBounds } from "../src/core/identify.js";
import { populationMoments } from "../src/core/forward/populationMoments.js";
import { assessPricing } from "../src/core/pricing/assessPricing.js";

interface Scenario {
  readonly name: string;
  readonly structure: Structure;
  readonly periods: number;
  readonly simulation?: Omit<SimulationOptions, "periods" | "seed">;
  /** Added to every low return: an alpha no structure explains when large enough. */
  readonly extraAlpha?: number;
}

const monthly = { weight: 0.5, factorVol: 0.045, factorMean: 0.006 };
const daily = { weight: 0.5, factorVol: 0.01, factorMean: 0.0004 };
const stress = { tails: 6, noiseAr: 0.2, garch: { alpha: 0.05, beta: 0.9 } };
const scenarios: Scenario[] = [
  {
    name: "monthly, truth at the upper end (no low noise), n = 687",
    structure: { ...monthly, lowBeta: 0.8, lowNoiseVol: 0, highNoiseVol: 0.03 },
    periods: 687,
  },
  {
    name: "monthly, truth at the lower end (no high noise), n = 687",
    structure: { ...monthly, lowBeta: 0.8, lowNoiseVol: 0.03, highNoiseVol: 0 },
    periods: 687,
  },
  {
    name: "monthly, truth inside the set, n = 687",
    structure: { ...monthly, lowBeta: 0.8, lowNoiseVol: 0.02, highNoiseVol: 0.02 },
    periods: 687,
  },
  { name: "monthly, upper end, n = 240", structure: { ...monthly, lowBeta: 0.8, lowNoiseVol: 0, highNoiseVol: 0.03 }, periods: 240 },
  {
    name: "daily, upper end, t(6) shocks, GARCH(1,1) factor, AR(1) noise, n = 2520",
    structure: { ...daily, lowBeta: 0.8, lowNoiseVol: 0, highNoiseVol: 0.006 },
    periods: 2520,
    simulation: stress,
  },
  // Persistent noise in a short sample: each book's noise AR(1), the factor iid.
  ...[0, 0.5, 0.9].map((noiseAr) => ({
    name: `monthly, truth inside the set, noise AR(1) ${noiseAr}, n = 120`,
    structure: { weight: 0.5, factorVol: 0.04, factorMean: 0.005, lowBeta: 0.7, lowNoiseVol: 0.01, highNoiseVol: 0.015 },
    periods: 120,
    simulation: { noiseAr },
  })),
  {
    name: "monthly, upper end, noise AR(1) 0.9, n = 687",
    structure: { ...monthly, lowBeta: 0.8, lowNoiseVol: 0, highNoiseVol: 0.03 },
    periods: 687,
    simulation: { noiseAr: 0.9 },
  },
  {
    name: "power: monthly, upper end, extra low alpha 0.002 a month",
    structure: { ...monthly, lowBeta: 0.8, lowNoiseVol: 0, highNoiseVol: 0.03 },
    periods: 687,
    extraAlpha: 0.002,
  },
  {
    name: "power: monthly, upper end, extra low alpha 0.005 a month",
    structure: { ...monthly, lowBeta: 0.8, lowNoiseVol: 0, highNoiseVol: 0.03 },
    periods: 687,
    extraAlpha: 0.005,
  },
];

const argument = (name: string, fallback: number): number => {
  const at = process.argv.indexOf(`--${name}`);
  return at === -1 ? fallback : Number(process.argv[at + 1]);
};
const reps = argument("reps", 1000);

for (const scenario of scenarios) {
  const started = Date.now();
  const bounds = identifiedBounds(populationMoments(scenario.structure));
  let rejected = 0;
  let explained = 0;
  let tested = 0;
  let unbounded = 0;
  for (let rep = 0; rep < reps; rep++) {
    const sample = drawSample(scenario.structure, { periods: scenario.periods, seed: 300000 + rep, ...scenario.simulation });
    const low = scenario.extraAlpha === undefined ? sample.low : sample.low.map((r) => r + (scenario.extraAlpha ?? 0));
    const pricing = assessPricing(
      { low, high: sample.high },
      { weight: scenario.structure.weight, confidence: 0.95, longRun: "hac", hac: {} },
    );
    if (pricing === null || pricing.test === null) continue;
    tested++;
    if (pricing.test.verdict === "not explained") rejected++;
    if (pricing.test.verdict === "explained") explained++;
    if (pricing.returnImplied.fieller.shape !== "bounded") unbounded++;
  }
  const rate = (k: number) => `${((100 * k) / tested).toFixed(1)}%`;
  console.log(`\n## ${scenario.name}`);
  console.log(
    `population set [${bounds.lowBeta.min.toFixed(6)}, ${bounds.lowBeta.max.toFixed(6)}], true b_low ${scenario.structure.lowBeta}; ${tested} samples tested of ${reps}; ${((Date.now() - started) / 1000).toFixed(1)} s`,
  );
  console.log(`| "not explained" at 5% (rejects H0) | ${rate(rejected)} |`);
  console.log(`| "explained" at 5% | ${rate(explained)} |`);
  console.log(`| Fieller's 95% set unbounded | ${rate(unbounded)} |`);
  console.log(`| binomial sd of a 5% rate | ${(100 * Math.sqrt((0.05 * 0.95) / tested)).toFixed(2)} points |`);
}
