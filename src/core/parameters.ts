/**
 * The rules the core's parameters follow, each written once with its wording. The option table
 * (src/options/table.ts) builds the command-line flags, the config file and the library's checks
 * from these same rules, so a value is accepted or refused with the same words wherever it comes
 * from; the core itself checks them only to catch programming errors (a RangeError is a bug).
 */

/** A rule a value must follow, and what a valid value is in words ("must be <expected>"). */
export interface Rule<T> {
  readonly accept: (value: T) => boolean;
  readonly expected: string;
  /** Why this value in particular is refused, when the rule can say more than `expected`. */
  readonly reason?: (value: T) => string | undefined;
}

/** The one sentence of a refusal: "must be <expected>", and the particular reason when there is one. */
export function refusal<T>(rule: Rule<T>, value: T): string {
  const reason = rule.reason?.(value);
  return `must be ${rule.expected}${reason === undefined ? "" : ` (${reason})`}`;
}

/** Bounds of a number: each end open (gt, lt) or closed (gte, lte), or absent. */
export interface NumberRange {
  readonly gt?: number;
  readonly gte?: number;
  readonly lt?: number;
  readonly lte?: number;
}

/** A finite number within `range`, worded from the range ("a number strictly between 0 and 1"). */
export function numberRule(range: NumberRange = {}): Rule<number> {
  const { gt, gte, lt, lte } = range;
  return {
    accept: (x) =>
      Number.isFinite(x) &&
      (gt === undefined || x > gt) &&
      (gte === undefined || x >= gte) &&
      (lt === undefined || x < lt) &&
      (lte === undefined || x <= lte),
    expected: describeRange(range),
  };
}

function describeRange({ gt, gte, lt, lte }: NumberRange): string {
  const low = gt ?? gte;
  const high = lt ?? lte;
  if (low !== undefined && high !== undefined) {
    if (gt !== undefined && lt !== undefined) return `a number strictly between ${low} and ${high}`;
    return `a number ${gt === undefined ? ">=" : ">"} ${low} and ${lt === undefined ? "<=" : "<"} ${high}`;
  }
  if (gt === 0) return "a positive number";
  if (low !== undefined) return `a number ${gt === undefined ? ">=" : ">"} ${low}`;
  if (high !== undefined) return `a number ${lt === undefined ? "<=" : "<"} ${high}`;
  return "a number";
}

/** A whole number from `minimum` to `maximum` (both included). */
export function integerRule(minimum: number, maximum: number): Rule<number> {
  return {
    accept: (x) => Number.isInteger(x) && x >= minimum && x <= maximum,
    expected: `a whole number from ${minimum} to ${maximum}`,
  };
}

/** Defaults of the core's parameters (the option table's defaults are these). */
export const defaultWeight = 0.5;
export const defaultSteps = 11;
export const defaultConfidence = 0.95;
/** Seed of the random streams. */
export const defaultSeed = 1;
/** Mean block length of the bootstrap: chosen from the data (Politis-White). */
export const defaultBlockLength = "auto";
/** Bootstrap replicates when a bootstrap is asked for without a number. */
export const defaultReplicates = 2000;

/** The fewest aligned observations the moments and the CAPM fits need. */
export const minimumObservations = 3;

/** The largest candidate grid: a limit on output size (each candidate is a row), not a numerical one. */
export const maximumSteps = 100_000;

/**
 * The largest number of bootstrap replicates: each keeps its draws in memory (1,000,000 replicates of
 * the bundled example take 8 s and 0.44 GB; ten times as many would take gigabytes).
 */
export const maximumReplicates = 1_000_000;

/**
 * The magnitudes the core computes with: a series' largest absolute value, and a structure's
 * standard deviations and means, lie within [1e-100, 1e+100]. The core computes on data scaled by a
 * power of two to about 1 and scales its results back, so within this range every reported variance
 * (the square of a magnitude, down to 1e-32 of it for a noise variance) is a normal double; beyond it
 * the squares leave double precision (1e-300 squared is 0, 1e+300 squared is infinite).
 */
export const magnitudeRange = { min: 1e-100, max: 1e100 } as const;

/**
 * The largest ratio of the two books' magnitudes: the core scales both by one factor (the market
 * proxy mixes them), so a book 1e-20 the size of the other keeps its squares and fourth powers (the
 * HAC sums) well inside double precision.
 */
export const magnitudeRatio = 1e20;

/**
 * Why the ranges of the weight and the confidence level are what they are:
 * - weight within [0.0001, 0.9999]: nearer 0 or 1 the proxy is one book to within rounding, and the
 *   other book's CAPM residuals (w or 1 - w times its noise) keep too few digits for the standard
 *   errors; below 2^-53 they are exactly zero.
 * - confidence within [0.5, 0.9999]: below 0.5 the one-sided normal quantile that bounds the
 *   Imbens-Manski critical value is negative (an interval narrower than the set); above 0.9999 the
 *   tail probability is below what a sample of returns informs, and near 1 it rounds away
 *   (0.9999999999999999 gives an infinite normal quantile).
 * Steps, replicates, periods and window sizes have limits on memory (each candidate, replicate or
 * period is kept), not numerical ones.
 */
export const weightRange = { gte: 0.0001, lte: 0.9999 } as const;
export const confidenceRange = { gte: 0.5, lte: 0.9999 } as const;

/**
 * The largest number of periods of a simulated sample: the sample and its dates are held in memory
 * and written at once (1,000,000 daily periods take about 0.5 GB; 10,000,000 took 4.7 GB).
 */
export const maximumPeriods = 1_000_000;

/** The largest mean block length of the bootstrap (any length beyond the sample's is one block). */
export const maximumBlockLength = 100_000_000;

/** A standard deviation: 0, or a magnitude within `magnitudeRange`. */
function deviationRule(): Rule<number> {
  const { min, max } = magnitudeRange;
  return {
    accept: (x) => x === 0 || (Number.isFinite(x) && x >= min && x <= max),
    expected: `0 or a number from ${min} to ${max}`,
  };
}

/** The core's parameters and their rules. */
export const parameters = {
  /** w, the weight of the low book in the market proxy M = w low + (1 - w) high. */
  weight: numberRule(weightRange),
  /** Confidence level of an interval. */
  confidence: numberRule(confidenceRange),
  /** Candidates in the grid, end points included. */
  steps: integerRule(2, maximumSteps),
  /** Bootstrap replicates (0: no bootstrap). */
  replicates: integerRule(0, maximumReplicates),
  /** Mean block length of the stationary bootstrap. */
  blockLength: numberRule({ gte: 1, lte: maximumBlockLength }),
  /** A seed of the random streams. */
  seed: integerRule(0, Number.MAX_SAFE_INTEGER),
  /** A fixed Bartlett lag truncation. */
  hacLags: integerRule(0, 100_000),
  /** A structural beta of the low book (the high one is positive when it is below 1/w). */
  lowBeta: numberRule({ gt: 0 }),
  /** The latent factor's standard deviation per period. */
  factorVol: numberRule({ gte: magnitudeRange.min, lte: magnitudeRange.max }),
  /** A mean per period. */
  mean: numberRule({ gte: -magnitudeRange.max, lte: magnitudeRange.max }),
  /** A noise standard deviation per period. */
  noiseVol: deviationRule(),
  /** Periods of a simulated sample. */
  periods: integerRule(1, maximumPeriods),
  /** Degrees of freedom of Student t innovations (finite variance needs more than 2). */
  tails: numberRule({ gt: 2 }),
  /** AR(1) coefficient of the noises (stationary). */
  noiseAr: numberRule({ gt: -1, lt: 1 }),
  /** Rows of a rolling window, or of the first expanding one (the moments need at least three). */
  windowLength: integerRule(minimumObservations, 100_000_000),
  /** Rows between consecutive windows. */
  windowStep: integerRule(1, 100_000_000),
  /** An assumed correlation of the books' noises (docs/methods.md §2). */
  noiseCorrelation: numberRule({ gte: -1, lte: 1 }),
  /** A portfolio's weight in the market proxy of the k-portfolio factor model, scaled to sum to 1 (docs/methods.md §31). */
  marketWeight: numberRule({ gt: 0, lte: 1e12 }),
} as const satisfies Record<string, Rule<number>>;

export type ParameterName = keyof typeof parameters;

/** Throws a RangeError (a programming error) when `value` breaks the rule of `name`. */
export function assertParameter(where: string, name: ParameterName, value: number): void {
  const rule = parameters[name];
  if (!rule.accept(value)) throw new RangeError(`${where}: ${name} must be ${rule.expected}, got ${value}`);
}
