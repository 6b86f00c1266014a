/**
 * Option vocabularies of the inference code, as readonly tuples so that a front end can build its
 * choices (commander) and enums (zod) from the same lists, and the defaults in one place.
 *
 * Defaults and why:
 * - HAC: Bartlett kernel (Newey & West 1987) with the Newey & West (1994) automatic lag, no VAR(1)
 *   prewhitening and no T/(T - k) adjustment: the most common choice in applied finance and R
 *   sandwich's NeweyWest(..., prewhite = FALSE) convention. Prewhitening and the adjustment are options.
 *   The bounds of the identified set instead take 6 sqrt(T) on each bound's own influence series with
 *   fixed-b critical values ("auto"): the Newey-West lag, chosen on all moment contributions at once,
 *   left their standard errors 20% short under volatility clustering (docs/coverage-study.md).
 * - Long-run covariance for the delta method: "hac" (serially dependent returns); "iid" is the plain
 *   sample covariance (divisor n - 1).
 * - Interval for the partially identified beta: Imbens & Manski (2004); Stoye (2009) as an option.
 * - Standard errors of the bounds: the delta method; the bootstrap's when asked for and computed.
 */

export const hacKernels = ["bartlett", "quadratic-spectral"] as const;
export type HacKernel = (typeof hacKernels)[number];

/**
 * "auto": for the bounds of the identified set, a Bartlett bandwidth of 6 sqrt(T) on each bound's
 * influence series with fixed-b critical values (boundsLongRun.ts); for every other HAC sum (CAPM,
 * Sharpe ratios) and with the quadratic-spectral kernel, Newey-West (1994).
 */
export const automaticBandwidths = ["auto", "newey-west-1994", "andrews-1991"] as const;
export type AutomaticBandwidth = (typeof automaticBandwidths)[number];

/** A fixed kernel bandwidth S (Bartlett lag L is S = L + 1), or an automatic rule. */
export type BandwidthChoice = number | AutomaticBandwidth;

export const longRunMethods = ["hac", "iid"] as const;
export type LongRunMethod = (typeof longRunMethods)[number];

export const intervalMethods = ["imbens-manski", "stoye"] as const;
export type IntervalMethod = (typeof intervalMethods)[number];

export const intervalSources = ["delta", "bootstrap"] as const;
export type IntervalSource = (typeof intervalSources)[number];

export const blockLengthRules = ["politis-white"] as const;
export type BlockLengthRule = (typeof blockLengthRules)[number];

export interface HacOptions {
  /** Default "bartlett". */
  readonly kernel?: HacKernel;
  /** Default "auto". Ignored when `lags` is given. */
  readonly bandwidth?: BandwidthChoice;
  /** Bartlett lag truncation L (weights 1 - j/(L + 1)); the same as bandwidth L + 1. */
  readonly lags?: number;
  /** VAR(1) prewhitening and recolouring (Andrews & Monahan 1992). Default false. */
  readonly prewhite?: boolean;
  /** Small-sample factor T/(T - k) for regression covariances. Default false. */
  readonly adjust?: boolean;
}

export const defaultHac = {
  kernel: "bartlett",
  bandwidth: "auto",
  prewhite: false,
  adjust: false,
} as const satisfies Required<Omit<HacOptions, "lags">>;

export { defaultConfidence } from "../parameters.js";
export const defaultLongRun: LongRunMethod = "hac";
export const defaultIntervalMethod: IntervalMethod = "imbens-manski";
export const defaultIntervalSource: IntervalSource = "delta";
