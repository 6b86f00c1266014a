/**
 * One-dimensional root finding and minimisation.
 *
 * - `findRoot`: Brent's (1973) method, "Algorithms for Minimization without Derivatives", ch. 4
 *   (inverse quadratic interpolation and secant steps, safeguarded by bisection), as given in Press
 *   et al., Numerical Recipes, 3rd ed., section 9.3. Needs a bracket with f(a) and f(b) of opposite
 *   signs (or one of them 0).
 * - `minimiseUnimodal`: golden-section search (Kiefer 1953; Numerical Recipes section 10.2) for a
 *   function with one minimum on [a, b]; the bracket shrinks by 0.618 per step whatever the shape,
 *   so a kinked objective (the Stoye interval's, a maximum of two smooth curves) is handled.
 */

export interface RootOptions {
  /** Absolute tolerance on x. Default 1e-14. */
  readonly tolerance?: number;
  readonly maxIterations?: number;
}

/** A root of f in [a, b], where f(a) f(b) <= 0. */
export function findRoot(f: (x: number) => number, a: number, b: number, options: RootOptions = {}): number {
  const tolerance = options.tolerance ?? 1e-14;
  const maxIterations = options.maxIterations ?? 200;
  let fa = f(a);
  let fb = f(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (fa > 0 === fb > 0) throw new RangeError(`findRoot: f(${a}) = ${fa} and f(${b}) = ${fb} do not bracket a root`);
  let c = b;
  let fc = fb;
  let d = b - a;
  let e = d;
  for (let iteration = 0; iteration < maxIterations; iteration++) {
    if (fb > 0 === fc > 0) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol1 = 2 * Number.EPSILON * Math.abs(b) + 0.5 * tolerance;
    const half = 0.5 * (c - b);
    if (Math.abs(half) <= tol1 || fb === 0) return b;
    if (Math.abs(e) >= tol1 && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * half * s;
        q = 1 - s;
      } else {
        const qa = fa / fc;
        const r = fb / fc;
        p = s * (2 * half * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      p = Math.abs(p);
      if (2 * p < Math.min(3 * half * q - Math.abs(tol1 * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = half;
        e = d;
      }
    } else {
      d = half;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol1 ? d : Math.sign(half) * tol1;
    fb = f(b);
  }
  return b;
}

const goldenFraction = (3 - Math.sqrt(5)) / 2;

/** The minimiser of a unimodal f on [a, b], to absolute tolerance `tolerance` in x (default 1e-10). */
export function minimiseUnimodal(f: (x: number) => number, a: number, b: number, tolerance = 1e-10): number {
  let lo = a;
  let hi = b;
  let x1 = lo + goldenFraction * (hi - lo);
  let x2 = hi - goldenFraction * (hi - lo);
  let f1 = f(x1);
  let f2 = f(x2);
  while (hi - lo > tolerance) {
    if (f1 <= f2) {
      hi = x2;
      x2 = x1;
      f2 = f1;
      x1 = lo + goldenFraction * (hi - lo);
      f1 = f(x1);
    } else {
      lo = x1;
      x1 = x2;
      f1 = f2;
      x2 = hi - goldenFraction * (hi - lo);
      f2 = f(x2);
    }
  }
  return f1 <= f2 ? x1 : x2;
}
