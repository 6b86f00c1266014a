/**
 * The sums of every window of a long sample, in amortised O(1) work per window.
 *
 * ## Method (moments)
 * Each window's means and centred sums are kept exactly as `crossProducts` (moments.ts) keeps them:
 * Welford's updates on data shifted by a reference row, every running mean and centred sum a
 * compensated (Neumaier) pair. A sliding window never *removes* a row (Welford's downdate subtracts
 * and accumulates absolute error from every row that ever passed through, which is ruinous after a
 * volatile stretch). Instead it uses the "two stacks" sliding-window aggregation (Hirzel, Schneider
 * & Tangwongsan 2017): the window [s, e] is split at a boundary b into
 * - an older part [s, b - 1], read from a table of suffix aggregates built backwards from b - 1
 *   (suffix[i] = moments of rows [i, b - 1]), and
 * - a newer part [b, e], a running Welford aggregate to which the entering rows are added,
 * and the two are combined with the pairwise merge of Chan, Golub & LeVeque (1983):
 *   mean = mean_A + d n_B / n,   S_xy = S_xy,A + S_xy,B + d_x d_y n_A n_B / n,   d = mean_B - mean_A.
 * When s reaches b the table is rebuilt over the current window (b = e + 1) and the newer part is
 * emptied. Every row is added once to the newer part and once to a suffix table, so the work is
 * O(1) amortised per row (about twice crossProducts' per-row work plus one merge per window), the
 * memory O(size), and each window's moments carry only the rounding of two from-scratch aggregates
 * and one merge: they agree with `crossProducts` on the window's rows to a few units in the last
 * place whatever came before (no drift, no periodic re-anchoring needed). Each part is shifted by
 * its own first row (the newer part) or last row (the suffix table), so price-level data lose no
 * digits; the merge forms d as (shift_B - shift_A) + (offset_B - offset_A).
 *
 * ## References
 * - Chan, T. F., Golub, G. H. & LeVeque, R. J. (1983), "Algorithms for computing the sample variance:
 *   analysis and recommendations", The American Statistician 37(3), 242-247.
 * - Welford, B. P. (1962), Technometrics 4(3), 419-420; Neumaier, A. (1974), ZAMM 54(1), 39-51.
 * - Hirzel, M., Schneider, S. & Tangwongsan, K. (2017), "Sliding-window aggregation algorithms:
 *   tutorial", DEBS 2017 (the two-stacks algorithm).
 */

import { assertParameter } from "../parameters.js";
import { PairAccumulator } from "./pairAccumulator.js";
import { checkSpec, type WindowSpec, windowCount, windowOffset } from "./windowPlan.js";

/** The raw sums of one window: means (full, unshifted) and centred sums of squares and products. */
export interface WindowSums {
  readonly start: number;
  readonly end: number;
  readonly observations: number;
  readonly lowMean: number;
  readonly highMean: number;
  readonly lowLow: number;
  readonly highHigh: number;
  readonly lowHigh: number;
}

/** The sums of every window (the two-stacks scan above). */
export function* scanWindows(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  weight: number,
  spec: WindowSpec,
  scale = 1,
): Generator<WindowSums, void, undefined> {
  checkSpec(spec);
  assertParameter("rolling", "weight", weight);
  const length = low.length;
  if (high.length !== length) throw new RangeError("rolling: low and high differ in length");
  if (typeof riskFree !== "number" && riskFree.length !== length) throw new RangeError("rolling: riskFree differs in length");
  const rf = (t: number): number => (typeof riskFree === "number" ? riskFree : riskFree[t]!);
  // The excess returns, times `scale` (a power of two: exact) when the caller computes on scaled data.
  const lowAt = (t: number): number => (low[t]! - rf(t)) * scale;
  const highAt = (t: number): number => (high[t]! - rf(t)) * scale;
  const count = windowCount(length, spec);
  const offset = windowOffset(length, spec);
  const newer = new PairAccumulator();

  if (spec.kind === "expanding") {
    let next = 0;
    for (let k = 0; k < count; k++) {
      const end = offset + spec.minPeriods - 1 + k * spec.step;
      for (; next <= end; next++) newer.add(lowAt(next), highAt(next));
      yield {
        start: 0,
        end,
        observations: end + 1,
        lowMean: newer.shiftLow + newer.lowOffset(),
        highMean: newer.shiftHigh + newer.highOffset(),
        lowLow: newer.sumLowLow(),
        highHigh: newer.sumHighHigh(),
        lowHigh: newer.sumLowHigh(),
      };
    }
    return;
  }

  const size = spec.size;
  // Suffix table of the older part: entry j holds rows [base + j, boundary - 1], shifted by row boundary - 1.
  const olderLow = new Float64Array(size);
  const olderHigh = new Float64Array(size);
  const olderLowLow = new Float64Array(size);
  const olderHighHigh = new Float64Array(size);
  const olderLowHigh = new Float64Array(size);
  const builder = new PairAccumulator();
  let olderShiftLow = 0;
  let olderShiftHigh = 0;
  let base = 0;
  let boundary = 0; // rows >= boundary are in the newer part
  let lastEnd = -1;
  for (let k = 0; k < count; k++) {
    const start = offset + k * spec.step;
    const end = start + size - 1;
    if (start >= boundary) {
      // Rebuild the suffix table over [start, end]; the newer part starts empty at end + 1.
      builder.reset();
      for (let t = end; t >= start; t--) {
        builder.add(lowAt(t), highAt(t));
        const j = t - start;
        olderLow[j] = builder.lowOffset();
        olderHigh[j] = builder.highOffset();
        olderLowLow[j] = builder.sumLowLow();
        olderHighHigh[j] = builder.sumHighHigh();
        olderLowHigh[j] = builder.sumLowHigh();
      }
      olderShiftLow = builder.shiftLow;
      olderShiftHigh = builder.shiftHigh;
      base = start;
      boundary = end + 1;
      newer.reset();
    } else {
      for (let t = lastEnd + 1; t <= end; t++) newer.add(lowAt(t), highAt(t));
    }
    lastEnd = end;
    const j = start - base;
    const aLow = olderLow[j]!;
    const aHigh = olderHigh[j]!;
    const nA = boundary - start;
    const nB = newer.n;
    if (nB === 0) {
      yield {
        start,
        end,
        observations: size,
        lowMean: olderShiftLow + aLow,
        highMean: olderShiftHigh + aHigh,
        lowLow: olderLowLow[j]!,
        highHigh: olderHighHigh[j]!,
        lowHigh: olderLowHigh[j]!,
      };
      continue;
    }
    // Chan et al. merge of [start, boundary - 1] (A) and [boundary, end] (B).
    const dLow = newer.shiftLow - olderShiftLow + (newer.lowOffset() - aLow);
    const dHigh = newer.shiftHigh - olderShiftHigh + (newer.highOffset() - aHigh);
    const fraction = nB / size;
    const weightAB = nA * fraction;
    yield {
      start,
      end,
      observations: size,
      lowMean: olderShiftLow + (aLow + dLow * fraction),
      highMean: olderShiftHigh + (aHigh + dHigh * fraction),
      lowLow: olderLowLow[j]! + newer.sumLowLow() + dLow * dLow * weightAB,
      highHigh: olderHighHigh[j]! + newer.sumHighHigh() + dHigh * dHigh * weightAB,
      lowHigh: olderLowHigh[j]! + newer.sumLowHigh() + dLow * dHigh * weightAB,
    };
  }
}
