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

/** The largest number of bootstrap replicates (each keeps its draws in memory). */
export const maximumReplicates = 10_000_000;

/** The core's parameters and their rules. */
export const parameters = {
  /** w, the weight of the low book in the market proxy M = w low + (1 - w) high. */
  weight: numberRule({ gt: 0, lt: 1 }),
  /** Confidence level of an interval. */
  confidence: numberRule({ gt: 0, lt: 1 }),
  /** Candidates in the grid, end points included. */
  steps: integerRule(2, maximumSteps),
  /** Bootstrap replicates (0: no bootstrap). */
  replicates: integerRule(0, maximumReplicates),
  /** Mean block length of the stationary bootstrap. */
  blockLength: numberRule({ gte: 1 }),
  /** A seed of the random streams. */
  seed: integerRule(0, Number.MAX_SAFE_INTEGER),
  /** A fixed Bartlett lag truncation. */
  hacLags: integerRule(0, 100_000),
  /** A structural beta of the low book (the high one is positive when it is below 1/w). */
  lowBeta: numberRule({ gt: 0 }),
  /** The latent factor's standard deviation per period. */
  factorVol: numberRule({ gt: 0 }),
  /** A mean per period. */
  mean: numberRule(),
  /** A noise standard deviation per period. */
  noiseVol: numberRule({ gte: 0 }),
  /** Periods of a simulated sample. */
  periods: integerRule(1, 100_000_000),
  /** Degrees of freedom of Student t innovations (finite variance needs more than 2). */
  tails: numberRule({ gt: 2 }),
  /** AR(1) coefficient of the noises (stationary). */
  noiseAr: numberRule({ gt: -1, lt: 1 }),
  /** Rows of a rolling window, or of the first expanding one (the moments need at least three). */
  windowLength: integerRule(minimumObservations, 100_000_000),
  /** Rows between consecutive windows. */
  windowStep: integerRule(1, 100_000_000),
} as const satisfies Record<string, Rule<number>>;

export type ParameterName = keyof typeof parameters;

/** Throws a RangeError (a programming error) when `value` breaks the rule of `name`. */
export function assertParameter(where: string, name: ParameterName, value: number): void {
  const rule = parameters[name];
  if (!rule.accept(value)) throw new RangeError(`${where}: ${name} must be ${rule.expected}, got ${value}`);
}
