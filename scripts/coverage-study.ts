/**
 * Monte Carlo coverage study of the uncertainty layer (docs/coverage-study.md).
 *
 * Data come from the model itself (simulateSample): R_i = rf + b_i F + e_i with known structure, so
 * the true low structural beta and the population bounds of its identified set are known. For each
 * scenario and replication the script runs assessUncertainty on n rows and records
 *   - whether the 95% Imbens-Manski interval for b_low covers the true b_low (delta-method se, HAC),
 *   - whether the pointwise 95% limits of each bound cover the population bound,
 *   - the estimated bounds and their delta-method standard errors, to compare the average standard
 *     error with the Monte Carlo standard deviation of the estimates,
 *   - optionally the same intervals (Imbens-Manski and pointwise) with stationary-bootstrap standard
 *     errors, as `intervalSource: "bootstrap"` reports them.
 * IM's interval is exact (asymptotically) at the ends of the set and conservative inside it, so the
 * 93-97% target applies to the scenarios whose truth is an endpoint (a zero noise variance).
 *
 * Run (from the repository root):
 *   npx esbuild scripts/coverage-study.ts --bundle --platform=node --format=esm --outfile=/tmp/coverage.mjs && node /tmp/coverage.mjs
 * Options: --reps 1000 --n 2520 --bootstrap 399 (bootstrap replicates; 0 = off) --quick (200 reps, n = 500)
 *   --only A,G (run these scenarios only, by the letter before the colon)
 */

import type { HacOptions } from "../src/core/inference/options.js";
import { assessUncertainty } from "../src/core/inference/uncertainty.js";
import { populationMoments, type Structure } from "../src/core/forward/populationMoments.js";
import { identifiedBounds } from "../src/core/identify.js";
import { drawSample, type SimulationOptions } from "../src/core/forward/simulate.js";

interface Scenario {
  readonly name: string;
  readonly structure: Structure;
  readonly simulation: Omit<SimulationOptions, "periods" | "seed">;
  readonly truthAtEndpoint: boolean;
  /** HAC settings for this scenario (default: Bartlett, Newey-West 1994 lag, no prewhitening). */
  readonly hac?: HacOptions;
}

const scenarios: Scenario[] = [
  {
    name: "A: truth at the lower bound (s_high = 0), Gaussian iid",
    structure: { lowBeta: 0.7, weight: 0.5, factorVol: 0.01, factorMean: 0.0003, lowNoiseVol: 0.006, highNoiseVol: 0 },
    simulation: {},
    truthAtEndpoint: true,
  },
  {
    name: "B: truth at the upper bound (s_low = 0), t(8) innovations, GARCH(1,1) factor (0.05, 0.90), AR(1) 0.2 noise",
    structure: { lowBeta: 0.8, weight: 0.5, factorVol: 0.01, factorMean: 0.0003, lowNoiseVol: 0, highNoiseVol: 0.008 },
    simulation: { tails: 8, garch: { alpha: 0.05, beta: 0.9 }, noiseAr: 0.2 },
    truthAtEndpoint: true,
  },
  {
    name: "B': as B, HAC with VAR(1) prewhitening (Andrews & Monahan 1992)",
    structure: { lowBeta: 0.8, weight: 0.5, factorVol: 0.01, factorMean: 0.0003, lowNoiseVol: 0, highNoiseVol: 0.008 },
    simulation: { tails: 8, garch: { alpha: 0.05, beta: 0.9 }, noiseAr: 0.2 },
    truthAtEndpoint: true,
    hac: { prewhite: true },
  },
  {
    name: "G: as B with Gaussian innovations (GARCH(1,1) factor (0.05, 0.90), AR(1) 0.2 noise, no fat tails)",
    structure: { lowBeta: 0.8, weight: 0.5, factorVol: 0.01, factorMean: 0.0003, lowNoiseVol: 0, highNoiseVol: 0.008 },
    simulation: { garch: { alpha: 0.05, beta: 0.9 }, noiseAr: 0.2 },
    truthAtEndpoint: true,
  },
  {
    name: "C: truth inside the set (equal noise), Gaussian iid",
    structure: { lowBeta: 0.75, weight: 0.5, factorVol: 0.01, factorMean: 0.0003, lowNoiseVol: 0.005, highNoiseVol: 0.005 },
    simulation: {},
    truthAtEndpoint: false,
  },
];

function argument(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? Number(process.argv[i + 1]) : fallback;
}

const quick = process.argv.includes("--quick");
const reps = argument("reps", quick ? 200 : 1000);
const n = argument("n", quick ? 500 : 2520);
const bootstrapReplicates = argument("bootstrap", quick ? 0 : 399);
const onlyAt = process.argv.indexOf("--only");
const only = onlyAt >= 0 ? new Set(process.argv[onlyAt + 1]!.split(",")) : null;

const sd = (x: number[]) => {
  const m = x.reduce((s, v) => s + v, 0) / x.length;
  return Math.sqrt(x.reduce((s, v) => s + (v - m) ** 2, 0) / (x.length - 1));
};
const mean = (x: number[]) => x.reduce((s, v) => s + v, 0) / x.length;
const pct = (k: number) => `${((100 * k) / reps).toFixed(1)}%`;

console.log(`# coverage study: ${reps} replications, n = ${n}, bootstrap replicates ${bootstrapReplicates}`);
for (const scenario of scenarios) {
  if (only !== null && !only.has(scenario.name.split(":")[0]!)) continue;
  const started = performance.now();
  const population = identifiedBounds(populationMoments(scenario.structure)).lowBeta;
  const truth = scenario.structure.lowBeta;
  let covered = 0;
  let coveredBootstrap = 0;
  let lowerCovered = 0;
  let upperCovered = 0;
  const lowerEstimates: number[] = [];
  const upperEstimates: number[] = [];
  const lowerSe: number[] = [];
  const upperSe: number[] = [];
  const lowerBootstrapSe: number[] = [];
  const upperBootstrapSe: number[] = [];
  const bandwidths: number[] = [];
  const blockLengths: number[] = [];
  let lowerBootstrapCovered = 0;
  let upperBootstrapCovered = 0;
  let lowerPercentileCovered = 0;
  let upperPercentileCovered = 0;
  for (let rep = 0; rep < reps; rep++) {
    const sample = drawSample(scenario.structure, { periods: n, seed: 100_000 + rep, ...scenario.simulation });
    const bootstrap =
      bootstrapReplicates > 0 ? { replicates: bootstrapReplicates, blockLength: "auto" as const, seed: rep + 1 } : undefined;
    const hac = scenario.hac ?? {};
    const assessed = assessUncertainty(sample, bootstrap === undefined ? { hac } : { hac, bootstrap });
    if (!assessed.ok) continue;
    const u = assessed.value;
    if (u.bounds === null || u.lowBeta === null) continue;
    const { min, max } = u.bounds.lowBeta;
    if (u.lowBeta.interval.lower <= truth && truth <= u.lowBeta.interval.upper) covered++;
    if (min.lower <= population.min && population.min <= min.upper) lowerCovered++;
    if (max.lower <= population.max && population.max <= max.upper) upperCovered++;
    lowerEstimates.push(min.estimate);
    upperEstimates.push(max.estimate);
    lowerSe.push(min.stdError);
    upperSe.push(max.stdError);
    bandwidths.push(u.method.bandwidth ?? Number.NaN);
    if (u.bootstrap !== null) {
      const seL = u.bootstrap.stdErrors.lowBetaMin ?? Number.NaN;
      const seU = u.bootstrap.stdErrors.lowBetaMax ?? Number.NaN;
      lowerBootstrapSe.push(seL);
      upperBootstrapSe.push(seU);
      blockLengths.push(u.bootstrap.blockLength);
      // The intervals the tool reports with intervalSource "bootstrap", from the same replicates.
      const fromBootstrap = assessUncertainty(sample, { hac, intervalSource: "bootstrap", bootstrapSummary: u.bootstrap });
      if (!fromBootstrap.ok || fromBootstrap.value.bounds === null || fromBootstrap.value.lowBeta === null) continue;
      const b = fromBootstrap.value;
      if (b.lowBeta!.interval.lower <= truth && truth <= b.lowBeta!.interval.upper) coveredBootstrap++;
      const bl = b.bounds!.lowBeta;
      if (bl.min.lower <= population.min && population.min <= bl.min.upper) lowerBootstrapCovered++;
      if (bl.max.lower <= population.max && population.max <= bl.max.upper) upperBootstrapCovered++;
      // The bootstrap's own percentile intervals of the two bounds (not adjusted for the block length).
      const pl = u.bootstrap.intervals.lowBetaMin;
      const pu = u.bootstrap.intervals.lowBetaMax;
      if (pl !== null && pl.lower <= population.min && population.min <= pl.upper) lowerPercentileCovered++;
      if (pu !== null && pu.lower <= population.max && population.max <= pu.upper) upperPercentileCovered++;
    }
  }
  const seconds = ((performance.now() - started) / 1000).toFixed(1);
  console.log(`\n## ${scenario.name}`);
  console.log(`true b_low ${truth}; population set [${population.min.toFixed(6)}, ${population.max.toFixed(6)}]; ${seconds} s`);
  console.log(`| measure | value |\n| --- | --- |`);
  console.log(`| IM 95% interval covers b_low (delta-method HAC se) | ${pct(covered)} |`);
  if (bootstrapReplicates > 0) console.log(`| IM 95% interval covers b_low (bootstrap se) | ${pct(coveredBootstrap)} |`);
  console.log(`| pointwise 95% CI of the lower bound covers the population lower bound | ${pct(lowerCovered)} |`);
  console.log(`| pointwise 95% CI of the upper bound covers the population upper bound | ${pct(upperCovered)} |`);
  if (bootstrapReplicates > 0) {
    console.log(`| pointwise 95% CI of the lower bound (bootstrap se) covers the population lower bound | ${pct(lowerBootstrapCovered)} |`);
    console.log(`| pointwise 95% CI of the upper bound (bootstrap se) covers the population upper bound | ${pct(upperBootstrapCovered)} |`);
    console.log(
      `| bootstrap 95% percentile interval of the lower bound covers the population lower bound | ${pct(lowerPercentileCovered)} |`,
    );
    console.log(
      `| bootstrap 95% percentile interval of the upper bound covers the population upper bound | ${pct(upperPercentileCovered)} |`,
    );
  }
  const ratio = (se: number[], est: number[]) =>
    `${mean(se).toExponential(4)} / ${sd(est).toExponential(4)} = ${(mean(se) / sd(est)).toFixed(3)}`;
  console.log(`| lower bound: mean delta se / MC sd of estimates | ${ratio(lowerSe, lowerEstimates)} |`);
  console.log(`| upper bound: mean delta se / MC sd of estimates | ${ratio(upperSe, upperEstimates)} |`);
  if (bootstrapReplicates > 0) {
    console.log(`| lower bound: mean bootstrap se / MC sd | ${ratio(lowerBootstrapSe, lowerEstimates)} |`);
    console.log(`| upper bound: mean bootstrap se / MC sd | ${ratio(upperBootstrapSe, upperEstimates)} |`);
  }
  console.log(`| mean delta-method bandwidth (larger of the two bounds') | ${mean(bandwidths).toFixed(1)} |`);
  if (bootstrapReplicates > 0) console.log(`| mean bootstrap block length | ${mean(blockLengths).toFixed(1)} |`);
  console.log(`| binomial sd of a 95% coverage over ${reps} reps | ${(100 * Math.sqrt((0.95 * 0.05) / reps)).toFixed(2)} points |`);
}
