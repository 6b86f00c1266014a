/**
 * Stationary-bootstrap standard errors of the model with an index (docs/methods.md §3, §7).
 *
 * Replicate r resamples the rows (low, high, index) jointly with the blocks `drawBlocks` gives from
 * `replicateRandom(seed, r)`: for one seed, block length and sample size these are the resamples of
 * the two-book bootstrap (bootstrap/replicates.ts), replicate by replicate. Per replicate the nine
 * sums of the centred series (three, their squares and cross-products) come from prefix sums over the
 * series taken twice, as there; the seven parameters follow from the six moments (indexModel.ts).
 * The standard error is the standard deviation of the replicates (divisor B - 1) over the replicates
 * where the parameter is finite; null with fewer than 2 of them.
 */

import { drawBlocks, replicateRandom, validateBlockLength } from "../inference/bootstrap/stationaryBootstrap.js";
import { type IndexParameter, indexParameterNames, indexPoint, momentPairs } from "./indexModel.js";

export interface IndexBootstrapPlan {
  readonly replicates: number;
  /** The mean block length, resolved (the two-book bootstrap's). */
  readonly blockLength: number;
  readonly seed: number;
}

/** Standard errors of the parameters over the replicates, in the units of the series given. */
export function indexBootstrapStdErrors(
  series: readonly [Float64Array, Float64Array, Float64Array],
  weight: number,
  plan: IndexBootstrapPlan,
): Record<IndexParameter, number | null> {
  validateBlockLength(plan.blockLength);
  const n = series[0].length;
  const means = series.map((s) => s.reduce((a, b) => a + b, 0) / n);
  const pairs = momentPairs;
  // Prefix sums (length 2n + 1) of the three centred series and of the six products, over the rows twice.
  const prefix = Array.from({ length: 9 }, () => new Float64Array(2 * n + 1));
  for (let t = 0; t < 2 * n; t++) {
    const d = series.map((s, i) => s[t % n]! - means[i]!);
    for (let i = 0; i < 3; i++) prefix[i]![t + 1] = prefix[i]![t]! + d[i]!;
    pairs.forEach(([a, b], k) => {
      prefix[3 + k]![t + 1] = prefix[3 + k]![t]! + d[a]! * d[b]!;
    });
  }
  const starts = new Int32Array(n);
  const lengths = new Int32Array(n);
  const sums = new Float64Array(9);
  const draws = indexParameterNames.map(() => new Float64Array(plan.replicates));
  for (let r = 0; r < plan.replicates; r++) {
    const blocks = drawBlocks(n, plan.blockLength, replicateRandom(plan.seed, r), starts, lengths);
    blockSums(prefix as Prefix, starts, lengths, blocks, sums);
    const moment = (k: number): number => {
      const [a, b] = pairs[k]!;
      return (sums[3 + k]! - (sums[a]! * sums[b]!) / n) / (n - 1);
    };
    const point = indexPoint({
      weight,
      lowVariance: moment(0),
      highVariance: moment(1),
      indexVariance: moment(2),
      lowHigh: moment(3),
      lowIndex: moment(4),
      highIndex: moment(5),
    });
    indexParameterNames.forEach((name, q) => {
      draws[q]![r] = point[name];
    });
  }
  return Object.fromEntries(indexParameterNames.map((name, q) => [name, standardDeviation(draws[q]!)])) as Record<
    IndexParameter,
    number | null
  >;
}

type Prefix = [
  Float64Array,
  Float64Array,
  Float64Array,
  Float64Array,
  Float64Array,
  Float64Array,
  Float64Array,
  Float64Array,
  Float64Array,
];

/** The nine sums over one resample's blocks, into `sums` (the arrays held in locals: a hot loop). */
function blockSums(prefix: Prefix, starts: Int32Array, lengths: Int32Array, blocks: number, sums: Float64Array): void {
  const [p0, p1, p2, p3, p4, p5, p6, p7, p8] = prefix;
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let s4 = 0;
  let s5 = 0;
  let s6 = 0;
  let s7 = 0;
  let s8 = 0;
  for (let b = 0; b < blocks; b++) {
    const from = starts[b]!;
    const to = from + lengths[b]!;
    s0 += p0[to]! - p0[from]!;
    s1 += p1[to]! - p1[from]!;
    s2 += p2[to]! - p2[from]!;
    s3 += p3[to]! - p3[from]!;
    s4 += p4[to]! - p4[from]!;
    s5 += p5[to]! - p5[from]!;
    s6 += p6[to]! - p6[from]!;
    s7 += p7[to]! - p7[from]!;
    s8 += p8[to]! - p8[from]!;
  }
  sums[0] = s0;
  sums[1] = s1;
  sums[2] = s2;
  sums[3] = s3;
  sums[4] = s4;
  sums[5] = s5;
  sums[6] = s6;
  sums[7] = s7;
  sums[8] = s8;
}

/** The standard deviation (divisor m - 1) of the finite values; null with fewer than 2. */
function standardDeviation(values: Float64Array): number | null {
  const finite = values.filter(Number.isFinite);
  if (finite.length < 2) return null;
  const mean = finite.reduce((a, b) => a + b, 0) / finite.length;
  let ss = 0;
  for (const v of finite) ss += (v - mean) ** 2;
  return Math.sqrt(ss / (finite.length - 1));
}
