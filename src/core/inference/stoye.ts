/**
 * Stoye (2009) confidence interval for a partially identified parameter.
 *
 * Stoye, J. (2009), "More on Confidence Intervals for Partially Identified Parameters", Econometrica
 * 77(4), 1299-1315, Appendix B (docs/methods.md §5.2): with se_l, se_u the standard errors of the
 * bound estimates, rho their correlation and Delta = theta_u - theta_l,
 *   minimise se_l c_l + se_u c_u  subject to  P(c_l, c_u + Delta/se_u) >= 1 - alpha  and
 *                                             P(c_u, c_l + Delta/se_l) >= 1 - alpha,
 *   P(a, b) = Int_{-inf}^{a} Phi((rho z + b) / sqrt(1 - rho^2)) phi(z) dz,
 *   interval [theta_l - se_l c_l, theta_u + se_u c_u].
 * P is a bivariate normal probability, log-concave in (a, b), so the feasible set is convex and the
 * least c_u for a given c_l, c_u(c_l) = max of the two constraint roots, is convex in c_l: the
 * objective is minimised over c_l by golden-section search, each c_u by Brent's root finder. The
 * integral is computed by adaptive Gauss-Legendre quadrature from z = min(-9, a - 1), below which the
 * normal mass (< 1.2e-19) is negligible. |rho| is capped at 0.999 (at |rho| = 1 the integrand is a step).
 * Delta is used as estimated (the superefficient case of the paper); negative Delta is set to 0.
 */

import type { BoundsEstimate, ParameterInterval } from "./imbensManski.js";
import { normalCdf, normalPdf, normalQuantile } from "../numerics/normal.js";
import { integrate } from "../numerics/quadrature.js";
import { findRoot, minimiseUnimodal } from "../numerics/scalarSolvers.js";
import { assertParameter } from "../parameters.js";

const correlationCap = 0.999;

/** P(a, b) = Int_{-inf}^{a} Phi((rho z + b)/sqrt(1 - rho^2)) phi(z) dz = P(Z1 <= a, Z2 >= -b), corr(Z1, Z2) = rho. */
export function stoyeProbability(a: number, b: number, rho: number): number {
  const r = Math.max(-correlationCap, Math.min(correlationCap, rho));
  const s = Math.sqrt(1 - r * r);
  return integrate((z) => normalCdf((r * z + b) / s) * normalPdf(z), Math.min(-9, a - 1), a, 1e-15);
}

export interface StoyeInput extends BoundsEstimate {
  /** Correlation of the two bound estimates. */
  readonly correlation: number;
}

export function stoyeInterval(input: StoyeInput, confidence: number): ParameterInterval {
  assertParameter("stoyeInterval", "confidence", confidence);
  const { lowerStdError: sl, upperStdError: su, correlation: rho } = input;
  if (!(sl > 0 && su > 0)) throw new RangeError("stoyeInterval: both standard errors must be positive");
  const delta = Math.max(input.upper - input.lower, 0);
  const zOne = normalQuantile(confidence);
  // Least c_u meeting constraint P(first, c_u + shift) >= conf (first fixed) and P(c_u, other) >= conf.
  const leastUpper = (cl: number): number => {
    const first = (cu: number) => stoyeProbability(cl, cu + delta / su, rho) - confidence;
    const second = (cu: number) => stoyeProbability(cu, cl + delta / sl, rho) - confidence;
    return Math.max(rootAbove(first, -delta / su - 12), rootAbove(second, -12));
  };
  const objective = (cl: number) => sl * cl + su * leastUpper(cl);
  // c_l must exceed z_{1-alpha} (the first constraint tends to Phi(c_l) as c_u grows).
  const cl = minimiseUnimodal(objective, zOne + 1e-9, normalQuantile(1 - (1 - confidence) / 2) + 6, 1e-9);
  const cu = leastUpper(cl);
  return { lower: input.lower - sl * cl, upper: input.upper + su * cu, criticalValue: { lower: cl, upper: cu } };
}

/** Root of an increasing g with g(start) < 0, bracketing upward by doubling steps. */
function rootAbove(g: (x: number) => number, start: number): number {
  let lo = start;
  let step = 1;
  let hi = lo + step;
  while (g(hi) < 0) {
    lo = hi;
    step *= 2;
    hi = lo + step;
    if (step > 1e6) return Infinity;
  }
  return findRoot(g, lo, hi, { tolerance: 1e-13 });
}
