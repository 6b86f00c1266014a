/**
 * The chi-square distribution's upper tail, P(X > x) for X ~ chi-square(nu) = Q(nu/2, x/2), the
 * regularised upper incomplete gamma function.
 *
 * ## Method
 * Q(a, z) = 1 - P(a, z): for z < a + 1 the series P(a, z) = e^-z z^a / Gamma(a) sum z^n / (a (a+1) ... (a+n))
 * (Abramowitz & Stegun 6.5.29), otherwise Legendre's continued fraction for Q(a, z) (A&S 6.5.31)
 * evaluated by the modified Lentz algorithm; log-gamma from the Lanczos approximation of
 * studentT.ts. Checked against scipy.stats.chi2.sf (test/core/numerics/chiSquare.test.ts).
 *
 * ## References
 * - Abramowitz, M. & Stegun, I. A. (1964), Handbook of Mathematical Functions, 6.5.29, 6.5.31, 26.4.19.
 * - Lentz, W. J. (1976), Applied Optics 15(3), 668-671.
 */
import { logGamma } from "./studentT.js";

const epsilon = 1e-16;
const maxTerms = 10_000;

/** Regularised upper incomplete gamma Q(a, z), a > 0, z >= 0. */
export function upperGammaRegularized(a: number, z: number): number {
  if (!(a > 0) || !(z >= 0)) return Number.NaN;
  if (z === 0) return 1;
  if (z === Number.POSITIVE_INFINITY) return 0;
  const front = Math.exp(a * Math.log(z) - z - logGamma(a));
  if (z < a + 1) {
    let term = 1 / a;
    let sum = term;
    for (let n = 1; n < maxTerms; n++) {
      term *= z / (a + n);
      sum += term;
      if (Math.abs(term) < Math.abs(sum) * epsilon) break;
    }
    return 1 - front * sum;
  }
  const tiny = 1e-300;
  let b = z + 1 - a;
  let c = 1 / tiny;
  let d = 1 / b;
  let h = d;
  for (let n = 1; n < maxTerms; n++) {
    const an = -n * (n - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < epsilon) break;
  }
  return front * h;
}

/** P(X > x) for X chi-square with `degreesOfFreedom` > 0. */
export function chiSquareSurvival(x: number, degreesOfFreedom: number): number {
  return x <= 0 ? 1 : upperGammaRegularized(degreesOfFreedom / 2, x / 2);
}
