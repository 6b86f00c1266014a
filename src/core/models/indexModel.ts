/**
 * The model with an independent market index: three indicators of one factor (docs/methods.md §3).
 *
 *   R_low = a_l + b_low F + e_low,  R_high = a_h + b_high F + e_high,  I = a_I + b_I F + e_I,
 *   Var F = phi, Var e_i = s_i, F and the three noises mutually uncorrelated, w b_low + (1 - w) b_high = 1.
 * Six second moments determine the seven parameters less the normalisation: with D = w C_LI + (1 - w) C_HI
 * (the covariance of the market proxy with the index),
 *   b_low = C_LI / D, b_high = C_HI / D, b_I = C_LI C_HI / (C_LH D), phi = C_LH D^2 / (C_LI C_HI),
 *   s_low = V_low - C_LH C_LI / C_HI, s_high = V_high - C_LH C_HI / C_LI, s_I = V_I - C_LI C_HI / C_LH.
 * b_low is the instrumental-variable slope of the low book on the market proxy with the index as the
 * instrument. Spearman (1904) and Anderson & Rubin (1956) for the one-factor model with three
 * indicators; the normalisation through the proxy is derived here.
 */

/** The six second moments (one divisor) of the excess returns low, high and index, and the weight. */
export interface IndexMoments {
  readonly weight: number;
  readonly lowVariance: number;
  readonly highVariance: number;
  readonly indexVariance: number;
  readonly lowHigh: number;
  readonly lowIndex: number;
  readonly highIndex: number;
}

/** The order of the moments in a gradient: (V_low, V_high, V_I, C_LH, C_LI, C_HI). */
export const indexMomentNames = ["lowVariance", "highVariance", "indexVariance", "lowHigh", "lowIndex", "highIndex"] as const;

/** The parameters, in the order of a Jacobian's rows. */
export const indexParameterNames = [
  "lowBeta",
  "highBeta",
  "indexLoading",
  "factorVariance",
  "lowNoiseVariance",
  "highNoiseVariance",
  "indexNoiseVariance",
] as const;
export type IndexParameter = (typeof indexParameterNames)[number];
export type IndexEstimates = Readonly<Record<IndexParameter, number>>;

/** The moments as a vector in `indexMomentNames` order. */
export const momentVector = (m: IndexMoments): number[] => indexMomentNames.map((name) => m[name]);

/** The moments from a vector in `indexMomentNames` order. */
export function momentsFromVector(weight: number, x: readonly number[]): IndexMoments {
  const [lowVariance, highVariance, indexVariance, lowHigh, lowIndex, highIndex] = x as [number, number, number, number, number, number];
  return { weight, lowVariance, highVariance, indexVariance, lowHigh, lowIndex, highIndex };
}

/** Cov(M, I) = w C_LI + (1 - w) C_HI. */
export const marketIndexCovariance = (m: IndexMoments): number => m.weight * m.lowIndex + (1 - m.weight) * m.highIndex;

/** The point estimates (not finite when a covariance it divides by is 0: the caller checks first). */
export function indexPoint(m: IndexMoments): IndexEstimates {
  const { lowHigh: clh, lowIndex: cli, highIndex: chi } = m;
  const d = marketIndexCovariance(m);
  return {
    lowBeta: cli / d,
    highBeta: chi / d,
    indexLoading: (cli / d) * (chi / clh),
    factorVariance: clh * (d / cli) * (d / chi),
    lowNoiseVariance: m.lowVariance - clh * (cli / chi),
    highNoiseVariance: m.highVariance - clh * (chi / cli),
    indexNoiseVariance: m.indexVariance - cli * (chi / clh),
  };
}

/** `indexPoint` as a vector in `indexParameterNames` order. */
export const parameterVector = (e: IndexEstimates): number[] => indexParameterNames.map((name) => e[name]);

/**
 * The analytic Jacobian of `indexPoint` (rows: parameters; columns: moments, `indexMomentNames` order):
 *   d b_low  / d(C_LI, C_HI) = ((1 - w) C_HI, -(1 - w) C_LI) / D^2,
 *   d b_high / d(C_LI, C_HI) = (-w C_HI, w C_LI) / D^2,
 *   d ln b_I / d(C_LH, C_LI, C_HI) = (-1/C_LH, 1/C_LI - w/D, 1/C_HI - (1 - w)/D),
 *   d ln phi / d(C_LH, C_LI, C_HI) = (1/C_LH, 2w/D - 1/C_LI, 2(1 - w)/D - 1/C_HI),
 *   d s_low / d(V_low, C_LH, C_LI, C_HI) = (1, -C_LI/C_HI, -C_LH/C_HI, C_LH C_LI/C_HI^2), and alike for s_high, s_I.
 */
export function indexJacobian(m: IndexMoments): number[][] {
  const w = m.weight;
  const v = 1 - w;
  const { lowHigh: clh, lowIndex: cli, highIndex: chi } = m;
  const d = marketIndexCovariance(m);
  const d2 = d * d;
  const p = indexPoint(m);
  const bi = p.indexLoading;
  const phi = p.factorVariance;
  //            V_low V_high V_I  C_LH                    C_LI                          C_HI
  return [
    [0, 0, 0, 0, (v * chi) / d2, (-v * cli) / d2],
    [0, 0, 0, 0, (-w * chi) / d2, (w * cli) / d2],
    [0, 0, 0, -bi / clh, bi * (1 / cli - w / d), bi * (1 / chi - v / d)],
    [0, 0, 0, phi / clh, phi * ((2 * w) / d - 1 / cli), phi * ((2 * v) / d - 1 / chi)],
    [1, 0, 0, -cli / chi, -clh / chi, (clh * cli) / (chi * chi)],
    [0, 1, 0, -chi / cli, (clh * chi) / (cli * cli), -clh / cli],
    [0, 0, 1, (cli * chi) / (clh * clh), -chi / clh, -cli / clh],
  ];
}

/** The six second moments of (low, high, index), in the order of the model's moment vector: three variances, three covariances. */
export const momentPairs: readonly (readonly [number, number])[] = [
  [0, 0],
  [1, 1],
  [2, 2],
  [0, 1],
  [0, 2],
  [1, 2],
];
