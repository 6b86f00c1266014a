/**
 * Draws return samples from a structure. Each source of randomness has its own stream of the seeded
 * generator (factor: 0, low noise: 1, high noise: 2), so switching one option does not reshuffle the
 * others, and the same seed always gives the same sample.
 *
 * - Factor: F_t = factorMean + factorVol z_t, or with GARCH(1,1) volatility clustering
 *   (Bollerslev 1986): h_t = omega + a eps_{t-1}^2 + b h_{t-1}, omega = factorVol^2 (1 - a - b), so the
 *   unconditional variance stays factorVol^2.
 * - Fat tails: z_t Student t with `tails` degrees of freedom (> 2), scaled to unit variance:
 *   z = N / sqrt(G / df) * sqrt((df - 2) / df), G chi-squared(df).
 * - Serial dependence in the noise: e_t = rho e_{t-1} + sqrt(1 - rho^2) s u_t, started from its
 *   stationary distribution, so Var e_t = s^2 at every t.
 * Returns are R_i,t = rf + b_i F_t + e_i,t.
 */

import { issues, parameterIssue } from "../arguments.js";
import { diagnose, type Diagnostic } from "../diagnostics.js";
import { highBetaFromLow } from "../identify.js";
import { failure, type Result, success } from "../result.js";

import { type Structure, structureIssues } from "./populationMoments.js";
import { createRandom, type RandomSource } from "../numerics/rng.js";

export interface SimulationOptions {
  readonly periods: number;
  readonly seed: number;
  /** Risk-free return per period added to both books. Default 0. */
  readonly riskFree?: number;
  /** Degrees of freedom of Student t innovations (> 2); absent for normal innovations. */
  readonly tails?: number;
  /** AR(1) coefficient of both noises, -1 < rho < 1. Default 0. */
  readonly noiseAr?: number;
  /** GARCH(1,1) coefficients of the factor, alpha, beta >= 0, alpha + beta < 1. */
  readonly garch?: { readonly alpha: number; readonly beta: number };
}

export interface SimulatedSample {
  readonly low: Float64Array;
  readonly high: Float64Array;
}

/**
 * A sample drawn from `structure` (the library's entry point): fails with "invalid-argument"
 * diagnostics when a parameter breaks its rule (core/parameters.ts): the structure's as for
 * `implied`, periods a whole number from 1 to 1,000,000, the seed a whole number from 0 to 2^53 - 1,
 * the risk-free return a mean, tails above 2, the AR(1) coefficient within (-1, 1), GARCH
 * coefficients non-negative with a sum below 1.
 */
export function simulateSample(structure: Structure, options: SimulationOptions): Result<SimulatedSample, Diagnostic[]> {
  const found = structureIssues(structure);
  if (options === null || typeof options !== "object") {
    found.push(
      diagnose({ code: "invalid-argument", argument: "options", value: String(options), expected: "an object { periods, seed, ... }" }),
    );
    return failure(found);
  }
  found.push(
    ...issues(
      parameterIssue("periods", "periods", options.periods),
      parameterIssue("seed", "seed", options.seed),
      options.riskFree === undefined ? null : parameterIssue("riskFree", "mean", options.riskFree),
      options.tails === undefined ? null : parameterIssue("tails", "tails", options.tails),
      options.noiseAr === undefined ? null : parameterIssue("noiseAr", "noiseAr", options.noiseAr),
      options.garch === undefined ? null : garchIssue(options.garch),
    ),
  );
  return found.length > 0 ? failure(found) : success(drawSample(structure, options));
}

function garchIssue(garch: { readonly alpha: number; readonly beta: number }): Diagnostic | null {
  const { alpha, beta } = garch ?? {};
  const valid = Number.isFinite(alpha) && Number.isFinite(beta) && alpha >= 0 && beta >= 0 && alpha + beta < 1;
  if (valid) return null;
  return diagnose({
    code: "invalid-argument",
    argument: "garch",
    value: `{ alpha: ${String(alpha)}, beta: ${String(beta)} }`,
    expected: "two numbers alpha, beta >= 0 with alpha + beta < 1",
  });
}

/** The draw itself, for options already checked (by `simulateSample`, or by the option table in the simulate job). */
export function drawSample(structure: Structure, options: SimulationOptions): SimulatedSample {
  const n = options.periods;
  const rf = options.riskFree ?? 0;
  const lowBeta = structure.lowBeta;
  const highBeta = highBetaFromLow(lowBeta, structure.weight);
  const innovation = innovationDraw(options.tails);
  const factorRandom = createRandom(options.seed, 0);
  const factor = factorPath(n, structure.factorMean, structure.factorVol, factorRandom, innovation, options.garch);
  const lowNoise = noisePath(n, structure.lowNoiseVol, options.noiseAr ?? 0, createRandom(options.seed, 1), innovation);
  const highNoise = noisePath(n, structure.highNoiseVol, options.noiseAr ?? 0, createRandom(options.seed, 2), innovation);
  const low = new Float64Array(n);
  const high = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    low[t] = rf + lowBeta * factor[t]! + lowNoise[t]!;
    high[t] = rf + highBeta * factor[t]! + highNoise[t]!;
  }
  return { low, high };
}

type Innovation = (random: RandomSource) => number;

function innovationDraw(tails: number | undefined): Innovation {
  if (tails === undefined) return (random) => random.normal();
  const scale = Math.sqrt((tails - 2) / tails);
  return (random) => (random.normal() / Math.sqrt((2 * random.gamma(tails / 2)) / tails)) * scale;
}

function factorPath(
  n: number,
  mean: number,
  vol: number,
  random: RandomSource,
  innovation: Innovation,
  garch: SimulationOptions["garch"],
): Float64Array {
  const path = new Float64Array(n);
  const unconditional = vol * vol;
  const a = garch?.alpha ?? 0;
  const b = garch?.beta ?? 0;
  const omega = unconditional * (1 - a - b);
  let variance = unconditional;
  for (let t = 0; t < n; t++) {
    const shock = Math.sqrt(variance) * innovation(random);
    path[t] = mean + shock;
    variance = garch === undefined ? unconditional : omega + a * shock * shock + b * variance;
  }
  return path;
}

function noisePath(n: number, vol: number, rho: number, random: RandomSource, innovation: Innovation): Float64Array {
  const path = new Float64Array(n);
  const scale = vol * Math.sqrt(1 - rho * rho);
  let previous = vol * innovation(random);
  for (let t = 0; t < n; t++) {
    const value = t === 0 ? previous : rho * previous + scale * innovation(random);
    path[t] = value;
    previous = value;
  }
  return path;
}
