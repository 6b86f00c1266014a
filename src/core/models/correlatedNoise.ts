/**
 * Sensitivity of the identified set to correlated noise (docs/methods.md §2).
 *
 * Model: the two-book model of §1 with Corr(e_low, e_high) = rho, so that
 *   V_low = b_low^2 phi + s_low,  V_high = b_high^2 phi + s_high,  C = b_low b_high phi + rho sqrt(s_low s_high).
 * With t = b_high / b_low and u = t sqrt(V_low / V_high) (the loading ratio in units of the books'
 * standard deviations), r = corr(low, high):
 * - rho <= 0: the set of b_low is the rho = 0 set [Lb, U] (u from r to 1/r); phi and the noise
 *   variances at each b_low change, the bounds do not;
 * - 0 < rho < r: an interval containing [Lb, U], its ends where the two structures that fit outside
 *   [Lb, U] merge: u1 and 1/u1 with u1 + 1/u1 = v,
 *     v = 2 (1 + r^2 - rho^2) / (r + sqrt((r^2 - rho^2)(1 - rho^2)))
 *   (the smaller root of rho^2 v^2 - 4 r v + 4 (1 + r^2 - rho^2) = 0, the discriminant condition of
 *   §2 written in v = u + 1/u; the condition is a palindromic quartic in u, hence the reduction);
 * - rho >= r: the structures that fit no longer form an interval; no bounds, a diagnostic.
 * The bounds and betas depend on the moments only through r, V_high / V_low and w: they do not depend
 * on the units or the divisor.
 */

import { diagnose, type Diagnostic } from "../diagnostics.js";
import type { MomentSummary } from "../identify.js";
import type { IdentifiedBounds } from "../types.js";

/** The second moments the sensitivity analysis needs (means are not used). */
export type NoiseMoments = Pick<MomentSummary, "weight" | "lowVariance" | "highVariance" | "covariance">;

/** How the set at a noise correlation relates to the set with uncorrelated noise. */
export type SensitivityKind = "unchanged" | "wider" | "not-an-interval" | "no-set";

export interface OptionalInterval {
  readonly min: number | null;
  readonly max: number | null;
}

/** The identified set when the books' noises have correlation `noiseCorrelation`. */
export interface NoiseSensitivity {
  readonly noiseCorrelation: number;
  readonly kind: SensitivityKind;
  /** The bounds of both structural betas; null ends when there is no interval. */
  readonly bounds: { readonly lowBeta: OptionalInterval; readonly highBeta: OptionalInterval };
  readonly diagnostics: readonly Diagnostic[];
}

/** One structure that fits at a given b_low and rho. */
export interface NoiseStructure {
  readonly factorVariance: number;
  readonly lowNoiseVariance: number;
  readonly highNoiseVariance: number;
}

const noBounds = { lowBeta: { min: null, max: null }, highBeta: { min: null, max: null } } as const;

/**
 * The set of structural betas at noise correlation `rho` (in [-1, 1]). `bounds` is the rho = 0 set
 * the solution reports (null when there is none: a covariance that is not positive or not determined),
 * returned as it is for rho <= 0 so that both agree to the bit.
 */
export function correlatedNoiseSet(m: NoiseMoments, rho: number, bounds: IdentifiedBounds | null): NoiseSensitivity {
  if (!(rho >= -1 && rho <= 1)) throw new RangeError(`correlatedNoiseSet: rho must be within [-1, 1], got ${rho}`);
  if (bounds === null || !(m.covariance > 0)) {
    return {
      noiseCorrelation: rho,
      kind: "no-set",
      bounds: noBounds,
      diagnostics: [diagnose({ code: "noise-correlation-no-set", noiseCorrelation: rho })],
    };
  }
  const interval = (i: { min: number; max: number }) => ({ min: i.min, max: i.max });
  if (rho <= 0) {
    return {
      noiseCorrelation: rho,
      kind: "unchanged",
      bounds: { lowBeta: interval(bounds.lowBeta), highBeta: interval(bounds.highBeta) },
      diagnostics: [],
    };
  }
  // Perfectly correlated books have r = 1 up to rounding; the formulas hold at r = 1.
  const r = Math.min(1, m.covariance / (Math.sqrt(m.lowVariance) * Math.sqrt(m.highVariance)));
  if (rho >= r) {
    return {
      noiseCorrelation: rho,
      kind: "not-an-interval",
      bounds: noBounds,
      diagnostics: [diagnose({ code: "noise-correlation-not-an-interval", noiseCorrelation: rho, correlation: r })],
    };
  }
  const u1 = innerRatio(r, rho);
  const k = Math.sqrt(m.highVariance) / Math.sqrt(m.lowVariance);
  const w = m.weight;
  // b_low = 1 / (w + (1 - w) t) and b_high = t b_low, t = k u: the smaller t gives the larger b_low.
  const ends = [k * u1, k / u1].map((t) => ({ low: 1 / (w + (1 - w) * t), high: t / (w + (1 - w) * t) }));
  const [upper, lower] = ends as [{ low: number; high: number }, { low: number; high: number }];
  return {
    noiseCorrelation: rho,
    kind: "wider",
    // Never narrower than the rho = 0 set (it contains it; rounding could shave the last digit).
    bounds: {
      lowBeta: { min: Math.min(lower.low, bounds.lowBeta.min), max: Math.max(upper.low, bounds.lowBeta.max) },
      highBeta: { min: Math.min(upper.high, bounds.highBeta.min), max: Math.max(lower.high, bounds.highBeta.max) },
    },
    diagnostics: [],
  };
}

/**
 * u1 in (0, r], the end of the set in standardised loading ratios below r, for 0 <= rho < r <= 1:
 * u1 = 2 / (v + sqrt(v^2 - 4)) with v from the module comment, both written without cancellation
 * (r^2 - rho^2 as (r - rho)(r + rho); v's numerator rationalised so that rho = 0 gives r + 1/r).
 */
export function innerRatio(r: number, rho: number): number {
  const root = Math.sqrt((r - rho) * (r + rho) * (1 - rho) * (1 + rho));
  const v = (2 * (1 + (r - rho) * (r + rho))) / (r + root);
  return 2 / (v + Math.sqrt(Math.max(0, (v - 2) * (v + 2))));
}

/**
 * Every structure that fits at `lowBeta` (0 < b_low < 1/w) and noise correlation `rho`: the roots phi of
 * A phi^2 + B phi + K = 0 (the squared condition of §2) with 0 <= phi <= min(V_low / b_low^2,
 * V_high / b_high^2) and C - b_low b_high phi of the sign of rho. At rho = 0 the single root
 * C / (b_low b_high) (when in range); at |rho| = 1 the equation is linear.
 */
export function noiseStructuresAt(m: NoiseMoments, rho: number, lowBeta: number): NoiseStructure[] {
  const w = m.weight;
  const bl = lowBeta;
  const bh = (1 - w * bl) / (1 - w);
  const { lowVariance: vl, highVariance: vh, covariance: c } = m;
  const p = bl * bh;
  const phiMax = Math.min(vl / (bl * bl), vh / (bh * bh));
  const roots: number[] = [];
  if (rho === 0) roots.push(c / p);
  else {
    const a = (1 - rho * rho) * p * p;
    const b = rho * rho * (vl * bh * bh + vh * bl * bl) - 2 * c * p;
    const k = c * c - rho * rho * vl * vh;
    if (a === 0) roots.push(-k / b);
    else {
      const disc = b * b - 4 * a * k;
      const scale = b * b + Math.abs(4 * a * k);
      // A discriminant that is rounding of zero is a double root (the ends of the wider set).
      const d = disc < 0 && disc > -1e-12 * scale ? 0 : disc;
      if (d >= 0) {
        const q = -0.5 * (b + Math.sign(b || 1) * Math.sqrt(d));
        roots.push(q / a);
        if (q !== 0 && d > 0) roots.push(k / q);
      }
    }
  }
  const tolerance = 1e-12;
  const fits = (phi: number): boolean => {
    if (!(phi >= -tolerance * phiMax && phi <= phiMax * (1 + tolerance))) return false;
    const gap = c - p * phi;
    return rho === 0 || Math.abs(gap) <= tolerance * Math.abs(c) || Math.sign(gap) === Math.sign(rho);
  };
  return roots
    .filter(fits)
    .sort((x, y) => x - y)
    .map((phi) => ({ factorVariance: phi, lowNoiseVariance: vl - bl * bl * phi, highNoiseVariance: vh - bh * bh * phi }));
}
