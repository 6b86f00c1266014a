/**
 * Automatic block length for the stationary and circular block bootstraps.
 *
 * Politis, D. N. & White, H. (2004), "Automatic block-length selection for the dependent bootstrap",
 * Econometric Reviews 23(1), 53-70, with the correction of Patton, A., Politis, D. N. & White, H.
 * (2009), Econometric Reviews 28(4), 372-375 (D_SB = 2 g^2). Conventions are those of the arch
 * package (bashtage/arch, arch/bootstrap/base.py `_single_optimal_block`), exactly as listed in
 * docs/methods.md §7.2, so that its published test value is reproduced:
 *   eps = x - mean; kn = max(5, floor(log10 n)); m_max = ceil(sqrt n) + kn; cv = 2 sqrt(log10(n)/n);
 *   acv[i] = sum_t eps_t eps_{t-i} / n (full length);
 *   |rho|[i] = |sum_t eps_t eps_{t-i}| / sqrt(v1 v2), v1, v2 the sums of squares of eps[i+1:] and
 *   eps[:-(i+1)];
 *   opt_m = i - kn for the first i >= kn with |rho|[i-kn .. i-1] all < cv; m = 2 max(opt_m, 1), or
 *   m_max if there is none; m <= m_max;
 *   flat-top window lambda(t) = 1 for t <= 1/2, 2(1 - t) above;
 *   G = sum_{k=1}^{m} 2 lambda(k/m) k acv[k];  g = acv[0] + sum_{k=1}^{m} 2 lambda(k/m) acv[k];
 *   b_SB = (2 G^2 / (2 g^2))^{1/3} n^{1/3},  b_CB = (2 G^2 / ((4/3) g^2))^{1/3} n^{1/3},
 *   both capped at b_max = ceil(min(3 sqrt n, n/3)).
 * The paper's own convention (M = 2 m_hat, common-sample autocovariances) gives different values on
 * the same data; arch's docstring notes the same about Patton's MATLAB code.
 * For several series (the low and high books) the bootstrap uses the largest per-series value.
 */

export interface OptimalBlockLength {
  /** Mean block length for the stationary bootstrap (Politis & Romano 1994). */
  readonly stationary: number;
  /** Block length for the circular block bootstrap. */
  readonly circular: number;
}

export function optimalBlockLength(x: ArrayLike<number>): OptimalBlockLength {
  const n = x.length;
  if (n < 10) throw new RangeError(`optimalBlockLength: needs at least 10 observations, got ${n}`);
  let mean = 0;
  for (let t = 0; t < n; t++) mean += x[t]!;
  mean /= n;
  const eps = Float64Array.from({ length: n }, (_, t) => x[t]! - mean);
  const bMax = Math.ceil(Math.min(3 * Math.sqrt(n), n / 3));
  const kn = Math.max(5, Math.floor(Math.log10(n)));
  const mMax = Math.ceil(Math.sqrt(n)) + kn;
  const cv = 2 * Math.sqrt(Math.log10(n) / n);
  const acv = new Float64Array(mMax + 1);
  const absCorrelation = new Float64Array(mMax + 1);
  const sumSquares = (from: number, to: number) => {
    let s = 0;
    for (let t = from; t < to; t++) s += eps[t]! * eps[t]!;
    return s;
  };
  let optM: number | null = null;
  for (let i = 0; i <= mMax; i++) {
    const v1 = sumSquares(i + 1, n);
    const v2 = sumSquares(0, n - (i + 1));
    let cross = 0;
    for (let t = i; t < n; t++) cross += eps[t]! * eps[t - i]!;
    acv[i] = cross / n;
    absCorrelation[i] = Math.abs(cross) / Math.sqrt(v1 * v2);
    if (i >= kn && optM === null) {
      let allSmall = true;
      for (let j = i - kn; j < i; j++) if (!(absCorrelation[j]! < cv)) allSmall = false;
      if (allSmall) optM = i - kn;
    }
  }
  const m = Math.min(optM === null ? mMax : 2 * Math.max(optM, 1), mMax);
  let bigG = 0;
  let longRun = acv[0]!;
  for (let k = 1; k <= m; k++) {
    const lambda = k / m <= 0.5 ? 1 : 2 * (1 - k / m);
    bigG += 2 * lambda * k * acv[k]!;
    longRun += 2 * lambda * acv[k]!;
  }
  const scale = Math.cbrt(n);
  const stationary = Math.cbrt((2 * bigG * bigG) / (2 * longRun * longRun)) * scale;
  const circular = Math.cbrt((2 * bigG * bigG) / ((4 / 3) * longRun * longRun)) * scale;
  return { stationary: Math.min(stationary, bMax), circular: Math.min(circular, bMax) };
}

/** The stationary-bootstrap block length for several aligned series: the largest per-series value. */
export function commonBlockLength(series: readonly ArrayLike<number>[]): number {
  return Math.max(...series.map((x) => optimalBlockLength(x).stationary));
}
