/**
 * Fixed-b critical values for a t statistic studentised by a Bartlett long-run variance at bandwidth
 * S = b T (docs/methods.md §8, "fixed-b critical values").
 *
 * Kiefer, N. M. & Vogelsang, T. J. (2005), Econometric Theory 21(6), 1130-1164: when S grows in
 * proportion to T, the estimate divided by the long-run variance tends to a random Q(b), not to 1,
 * with E Q(b) = 1 - b + b^2/3 (b <= 1) for the Bartlett kernel, and t = Z / sqrt(Q(b)) has wider
 * tails than the normal. Their fitted critical-value function for the two-sided 5% test (the 97.5%
 * quantile of t), Bartlett kernel:
 *   q_0.975(b) = 1.9600 + 2.9694 b + 0.4160 b^2 - 0.5324 b^3.
 * For any probability p the quantile is taken from a scaled Student t matched to it:
 *   Q(b) ~ m chi^2_nu / nu with m = 1 - b + b^2/3, so t ~ t_nu / sqrt(m), and nu is the value for
 *   which t_nu^{-1}(0.975) / sqrt(m) = q_0.975(b).
 * The same paper's one-sided 5% function, 1.6449 + 2.1859 b + 0.3142 b^2 - 0.3427 b^3, is reproduced
 * to within 0.6% for b <= 0.1, 1.2% for b <= 0.2 and 3% up to b = 1 (test/core/inference/hac/fixedB.test.ts).
 */

import { normalQuantile } from "../../numerics/normal.js";
import { findRoot } from "../../numerics/scalarSolvers.js";
import { studentTTwoSidedP } from "../../numerics/studentT.js";

/** E Q(b) for the Bartlett kernel, b in [0, 1]. */
export function bartlettFixedBMean(b: number): number {
  return 1 - b + (b * b) / 3;
}

/** Kiefer-Vogelsang's 97.5% critical-value function, Bartlett kernel. */
export function kieferVogelsang975(b: number): number {
  return 1.96 + 2.9694 * b + 0.416 * b * b - 0.5324 * b * b * b;
}

/** The p-quantile (p > 1/2) of Student's t with nu degrees of freedom (nu = Infinity: the normal). */
export function studentTQuantile(p: number, nu: number): number {
  const z = normalQuantile(p);
  if (nu === Number.POSITIVE_INFINITY) return z;
  const tail = 2 * (1 - p);
  // P(|T| >= t) decreases in t from 1 at t = 0; the t quantile lies above the normal one.
  let hi = Math.max(2 * z, 1);
  while (studentTTwoSidedP(hi, nu) > tail) hi *= 2;
  return findRoot((t) => studentTTwoSidedP(t, nu) - tail, 0, hi, { tolerance: 1e-12 });
}

/** The degrees of freedom nu matched to the 97.5% function at b (Infinity when b is about 0). */
function matchedDegreesOfFreedom(b: number): number {
  const target = kieferVogelsang975(b) * Math.sqrt(bartlettFixedBMean(b));
  const z = normalQuantile(0.975);
  if (!(target > z * (1 + 1e-9))) return Number.POSITIVE_INFINITY;
  // nu with P(|T_nu| >= target) = 0.05: the tail probability falls as nu grows; search log(nu).
  const excess = (logNu: number) => studentTTwoSidedP(target, Math.exp(logNu)) - 0.05;
  if (excess(0) <= 0) return 1;
  if (excess(Math.log(1e9)) >= 0) return 1e9;
  return Math.exp(findRoot(excess, 0, Math.log(1e9), { tolerance: 1e-12 }));
}

let last: { b: number; p: number; value: number } | null = null;

/**
 * The p-quantile (1/2 < p < 1) of the fixed-b limit of t for the Bartlett kernel at b = S/T (cut to
 * [0, 1]). Remembers the last value: rolling windows ask for the same b and p again and again.
 */
export function bartlettFixedBQuantile(b: number, p: number): number {
  const within = Math.min(1, Math.max(0, b));
  if (last !== null && last.b === within && last.p === p) return last.value;
  // At 97.5% (the default 95% level) the matched t gives Kiefer-Vogelsang's function itself.
  const value =
    within === 0
      ? normalQuantile(p)
      : p === 0.975
        ? kieferVogelsang975(within)
        : studentTQuantile(p, matchedDegreesOfFreedom(within)) / Math.sqrt(bartlettFixedBMean(within));
  last = { b: within, p, value };
  return value;
}

/**
 * The factor by which the fixed-b quantile exceeds the normal one at the two-sided level
 * `confidence` (p = 1 - alpha/2): multiplying a standard error by it turns normal-theory limits into
 * fixed-b limits.
 */
export function bartlettFixedBFactor(b: number, confidence: number): number {
  const p = 1 - (1 - confidence) / 2;
  return bartlettFixedBQuantile(b, p) / normalQuantile(p);
}

/**
 * The fixed-b factor for a standard error from the stationary bootstrap with mean block length
 * `blockLength` on n rows: the Bartlett factor at the equivalent bandwidth 2 blockLength. The
 * bootstrap's variance of a mean is a lag-window estimate with weights about (1 - 1/b)^k ~ exp(-k/b)
 * (docs/methods.md §7.1); under fixed-b its expected share of the long-run variance is about
 * 1 - (b/n) Int k(x) dx, which is 1 - 2b/n for these weights and 1 - S/n for Bartlett's: the two
 * agree at S = 2b (an approximation of this project, checked by the coverage study).
 */
export function stationaryBootstrapFixedBFactor(blockLength: number, n: number, confidence: number): number {
  return bartlettFixedBFactor((2 * blockLength) / n, confidence);
}
