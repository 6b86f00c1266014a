/**
 * Sample means, variances and covariances.
 *
 * ## Method
 * One pass of Welford's (1962) updating recurrences, generalised to cross-products, applied to the
 * data shifted by their first observation, with every running mean and centred sum carried as a
 * compensated pair (Neumaier summation). Welford's update keeps the centred sums accurate whatever
 * the ratio of mean to spread; the shift removes the magnitude of the level (prices, percent) before
 * any arithmetic; compensation stops rounding errors from accumulating over long series. On the NIST
 * StRD univariate sets this reaches the certified digits as far as double-precision input allows
 * (see test/core/moments.nist.test.ts): 15 digits except NumAcc3/NumAcc4/Mavro/Michelso, where
 * parsing the decimal data into doubles already limits every method to numpy's figures.
 *
 * ## References
 * - Welford, B. P. (1962), "Note on a method for calculating corrected sums of squares and products",
 *   Technometrics 4(3), 419-420.
 * - Neumaier, A. (1974), "Rundungsfehleranalyse einiger Verfahren zur Summation endlicher Summen",
 *   ZAMM 54(1), 39-51.
 * - Chan, T. F., Golub, G. H. & LeVeque, R. J. (1983), "Algorithms for computing the sample variance:
 *   analysis and recommendations", The American Statistician 37(3), 242-247.
 */

import { inChunks, seriesKernel } from "./numerics/seriesKernel.js";
import { CHUNK } from "./numerics/seriesLoops.js";

/** Means and centred sums of squares and cross-products of several aligned series. */
export interface CrossProducts {
  readonly n: number;
  readonly means: readonly number[];
  /** sums[i][j] = sum_t (x_i,t - mean_i)(x_j,t - mean_j): divide by n - 1 for the sample covariance. */
  readonly sums: readonly (readonly number[])[];
}

/**
 * Means and centred cross-products of `series` (all the same length) in one pass: the core's own
 * pass, on arguments it has checked (the library's `crossProducts`, statistics.ts, checks them).
 * @throws RangeError if the series differ in length (a programming error, not a data condition).
 * @example welfordCrossProducts([[1, 2, 3], [2, 4, 7]]).sums[0][1] // => 5
 */
export function welfordCrossProducts(series: readonly ArrayLike<number>[]): CrossProducts {
  if (series.length === 3 && series.every((s) => s instanceof Float64Array)) {
    return crossProducts3(series[0] as Float64Array, series[1] as Float64Array, series[2] as Float64Array);
  }
  if (series.length === 2 && series.every((s) => s instanceof Float64Array)) {
    // The unrolled pass on (x, y, y): each mean and each sum S_ij is updated from series i and j
    // alone, so its first two rows and columns are the two-series pass's, bit for bit.
    const x = series[0] as Float64Array;
    const { n, means, sums } = crossProducts3(x, series[1] as Float64Array, series[1] as Float64Array);
    const [s0, s1] = sums as [readonly number[], readonly number[]];
    return { n, means: means.slice(0, 2), sums: [s0.slice(0, 2), s1.slice(0, 2)] };
  }
  const k = series.length;
  const n = k === 0 ? 0 : series[0]!.length;
  for (const s of series) {
    if (s.length !== n) throw new RangeError(`welfordCrossProducts: series lengths differ (${s.length} vs ${n})`);
  }
  const shift = new Float64Array(k);
  for (let i = 0; i < k; i++) shift[i] = n > 0 ? series[i]![0]! : 0;
  // Each running mean and each centred sum is a compensated pair (value + carried rounding error).
  const mean = new Float64Array(k);
  const meanError = new Float64Array(k);
  const sums = new Float64Array(k * k);
  const sumsError = new Float64Array(k * k);
  const before = new Float64Array(k);
  const after = new Float64Array(k);
  for (let t = 0; t < n; t++) {
    const inverseCount = 1 / (t + 1);
    for (let i = 0; i < k; i++) {
      const value = series[i]![t]! - shift[i]!;
      const d = value - (mean[i]! + meanError[i]!);
      before[i] = d;
      const increment = d * inverseCount;
      const m = mean[i]!;
      const updated = m + increment;
      meanError[i] = meanError[i]! + (Math.abs(m) >= Math.abs(increment) ? m - updated + increment : increment - updated + m);
      mean[i] = updated;
      after[i] = value - (updated + meanError[i]!);
    }
    // Welford: S_ij += (x_i - oldMean_i)(x_j - newMean_j), added with Neumaier compensation.
    for (let i = 0; i < k; i++) {
      const di = before[i]!;
      for (let j = i; j < k; j++) {
        const index = i * k + j;
        const term = di * after[j]!;
        const sum = sums[index]!;
        const updated = sum + term;
        sumsError[index] = sumsError[index]! + (Math.abs(sum) >= Math.abs(term) ? sum - updated + term : term - updated + sum);
        sums[index] = updated;
      }
    }
  }
  const means: number[] = [];
  const matrix: number[][] = [];
  for (let i = 0; i < k; i++) {
    means.push(shift[i]! + (mean[i]! + meanError[i]!));
    const row: number[] = [];
    for (let j = 0; j < k; j++) {
      const index = i <= j ? i * k + j : j * k + i;
      row.push(sums[index]! + sumsError[index]!);
    }
    matrix.push(row);
  }
  return { n, means, sums: matrix };
}

/**
 * welfordCrossProducts for exactly three Float64Array series (what solve uses), with the loops unrolled:
 * the same operations in the same order as the general code, so the same results bit for bit.
 */
function crossProducts3(x: Float64Array, y: Float64Array, z: Float64Array): CrossProducts {
  if (y.length !== x.length || z.length !== x.length) throw new RangeError(`crossProducts: series lengths differ`);
  return welford3(x, y, z, 0, 0, 1, true);
}

/**
 * The moments of solve's three excess series, without building them: low - r, high - r and the
 * market w (low - r) + (1 - w)(high - r), where r is the risk-free return (one number, or one per
 * period). Equal bit for bit to `crossProducts` of the three series computed first. With `scale` (a
 * power of two, scaling.ts) the excess returns are multiplied by it as they are formed.
 */
export function excessCrossProducts(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  weight: number,
  scale = 1,
  useKernel = true,
): CrossProducts {
  const n = low.length;
  if (high.length !== n || (typeof riskFree !== "number" && riskFree.length !== n))
    throw new RangeError(`excessCrossProducts: series lengths differ`);
  return welford3(low, high, null, riskFree, weight, scale, useKernel);
}

/**
 * The unrolled three-series Welford pass on s (x - r), s (y - r) and z, with z = w s (x - r) +
 * (1 - w) s (y - r) when null; r = 0 and s = 1 give crossProducts3 exactly (x - 0 is x, 1 x is x). The rows are taken in chunks by a
 * small function (`welfordChunk`) that V8 optimises as a whole after a few calls: one long loop would
 * run in on-stack-replaced code, which boxes its doubles and is several times slower. Unless
 * `useKernel` is false, the chunks run in WebAssembly (numerics/seriesKernel.ts: the same bits, and
 * compiled speed from the first row, where V8 would interpret the JavaScript loop of a short sample).
 */
function welford3(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  z: Float64Array | null,
  riskFree: number | ArrayLike<number>,
  weight: number,
  scale: number,
  useKernel: boolean,
): CrossProducts {
  const n = x.length;
  const rate = typeof riskFree === "number" ? riskFree : 0;
  const rates = typeof riskFree === "number" ? null : riskFree;
  const r0 = rates === null ? rate : n > 0 ? rates[0]! : 0;
  const kx = n > 0 ? (x[0]! - r0) * scale : 0;
  const ky = n > 0 ? (y[0]! - r0) * scale : 0;
  const kz = n > 0 ? (z === null ? weight * kx + (1 - weight) * ky : z[0]!) : 0;
  const state = new Float64Array(STATE_SIZE);
  const shift = Float64Array.of(kx, ky, kz, scale);
  const kernel = useKernel ? seriesKernel() : null;
  if (kernel !== null) {
    kernel.state.fill(0);
    kernel.parameters.set(shift);
    inChunks(kernel, { x, y, z, rates }, (from, count) => kernel.welford(from, count, z !== null, rates !== null, +rate, weight));
    state.set(kernel.state.subarray(0, STATE_SIZE));
  } else
    for (let from = 0; from < n; from += CHUNK) welfordChunk(x, y, z, rates, rate, weight, shift, from, Math.min(n, from + CHUNK), state);
  // A running value plus its carried error: state[value] + state[error].
  const total = (value: number, error: number): number => state[value]! + state[error]!;
  const xy = total(7, 13);
  const xz = total(8, 14);
  const yz = total(10, 16);
  return {
    n,
    means: [kx + total(0, 3), ky + total(1, 4), kz + total(2, 5)],
    sums: [
      [total(6, 12), xy, xz],
      [xy, total(9, 15), yz],
      [xz, yz, total(11, 17)],
    ],
  };
}

/** Rows per call of welfordChunk (and of the other chunked passes, numerics/seriesLoops.ts). */
export { CHUNK };
/** Running means m, their errors e, sums s and their errors c: mx my mz ex ey ez, sxx sxy sxz syy syz szz, cxx ... czz. */
const STATE_SIZE = 18;

/** Rows [from, to) of welford3, continuing from and updating `state`. */
function welfordChunk(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  z: Float64Array | null,
  rates: ArrayLike<number> | null,
  rate: number,
  weight: number,
  shift: Float64Array,
  from: number,
  to: number,
  state: Float64Array,
): void {
  const other = 1 - weight;
  const kx = shift[0]!,
    ky = shift[1]!,
    kz = shift[2]!,
    scale = shift[3]!;
  let mx = state[0]!,
    my = state[1]!,
    mz = state[2]!,
    ex = state[3]!,
    ey = state[4]!,
    ez = state[5]!;
  let sxx = state[6]!,
    sxy = state[7]!,
    sxz = state[8]!,
    syy = state[9]!,
    syz = state[10]!,
    szz = state[11]!;
  let cxx = state[12]!,
    cxy = state[13]!,
    cxz = state[14]!,
    cyy = state[15]!,
    cyz = state[16]!,
    czz = state[17]!;
  const fixedRate = +rate; // a number to the optimiser: no boxing of rates[t] (seriesLoops.ts)
  // Each update is next = s + t with Neumaier's carry c += |s| >= |t| ? s - next + t : t - next + s,
  // written out: short series run in the interpreter, where a call per update costs more than the sum.
  for (let t = from; t < to; t++) {
    const inverseCount = 1 / (t + 1);
    const r = rates === null ? fixedRate : rates[t]!;
    const lt = (x[t]! - r) * scale;
    const ht = (y[t]! - r) * scale;
    const vx = lt - kx;
    const vy = ht - ky;
    const vz = (z === null ? weight * lt + other * ht : z[t]!) - kz;
    const dx = vx - (mx + ex);
    const dy = vy - (my + ey);
    const dz = vz - (mz + ez);
    let inc = dx * inverseCount;
    let next = mx + inc;
    ex += Math.abs(mx) >= Math.abs(inc) ? mx - next + inc : inc - next + mx;
    mx = next;
    inc = dy * inverseCount;
    next = my + inc;
    ey += Math.abs(my) >= Math.abs(inc) ? my - next + inc : inc - next + my;
    my = next;
    inc = dz * inverseCount;
    next = mz + inc;
    ez += Math.abs(mz) >= Math.abs(inc) ? mz - next + inc : inc - next + mz;
    mz = next;
    const ax = vx - (mx + ex);
    const ay = vy - (my + ey);
    const az = vz - (mz + ez);
    let term = dx * ax;
    next = sxx + term;
    cxx += Math.abs(sxx) >= Math.abs(term) ? sxx - next + term : term - next + sxx;
    sxx = next;
    term = dx * ay;
    next = sxy + term;
    cxy += Math.abs(sxy) >= Math.abs(term) ? sxy - next + term : term - next + sxy;
    sxy = next;
    term = dx * az;
    next = sxz + term;
    cxz += Math.abs(sxz) >= Math.abs(term) ? sxz - next + term : term - next + sxz;
    sxz = next;
    term = dy * ay;
    next = syy + term;
    cyy += Math.abs(syy) >= Math.abs(term) ? syy - next + term : term - next + syy;
    syy = next;
    term = dy * az;
    next = syz + term;
    cyz += Math.abs(syz) >= Math.abs(term) ? syz - next + term : term - next + syz;
    syz = next;
    term = dz * az;
    next = szz + term;
    czz += Math.abs(szz) >= Math.abs(term) ? szz - next + term : term - next + szz;
    szz = next;
  }
  state[0] = mx;
  state[1] = my;
  state[2] = mz;
  state[3] = ex;
  state[4] = ey;
  state[5] = ez;
  state[6] = sxx;
  state[7] = sxy;
  state[8] = sxz;
  state[9] = syy;
  state[10] = syz;
  state[11] = szz;
  state[12] = cxx;
  state[13] = cxy;
  state[14] = cxz;
  state[15] = cyy;
  state[16] = cyz;
  state[17] = czz;
}
