/**
 * Adaptive Gauss-Legendre quadrature for smooth integrands.
 *
 * Nodes and weights of the 12-point rule are computed once by Newton's method on the Legendre
 * polynomial P_12 (three-term recurrence; Numerical Recipes, 3rd ed., section 4.6, "gauleg"). An
 * interval is accepted when the rule on it and the sum of the rule on its two halves differ by less
 * than the tolerance allotted to it (proportional to its length); otherwise both halves are refined.
 */

const order = 12;

function legendreRule(n: number): { nodes: Float64Array; weights: Float64Array } {
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let i = 0; i < Math.ceil(n / 2); i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let derivative = 0;
    for (let iteration = 0; iteration < 100; iteration++) {
      let p1 = 1;
      let p2 = 0;
      for (let j = 1; j <= n; j++) {
        const p3 = p2;
        p2 = p1;
        p1 = ((2 * j - 1) * x * p2 - (j - 1) * p3) / j;
      }
      derivative = (n * (x * p1 - p2)) / (x * x - 1);
      const step = p1 / derivative;
      x -= step;
      if (Math.abs(step) < 1e-16) break;
    }
    nodes[i] = -x;
    nodes[n - 1 - i] = x;
    weights[i] = 2 / ((1 - x * x) * derivative * derivative);
    weights[n - 1 - i] = weights[i]!;
  }
  return { nodes, weights };
}

const rule = legendreRule(order);

function gauss(f: (x: number) => number, a: number, b: number): number {
  const mid = (a + b) / 2;
  const half = (b - a) / 2;
  let total = 0;
  for (let i = 0; i < order; i++) total += rule.weights[i]! * f(mid + half * rule.nodes[i]!);
  return total * half;
}

/** The integral of f over [a, b] to about `tolerance` absolute (default 1e-15). */
export function integrate(f: (x: number) => number, a: number, b: number, tolerance = 1e-15): number {
  const whole = gauss(f, a, b);
  return refine(f, a, b, whole, tolerance, 0);
}

function refine(f: (x: number) => number, a: number, b: number, whole: number, tolerance: number, depth: number): number {
  const mid = (a + b) / 2;
  const left = gauss(f, a, mid);
  const right = gauss(f, mid, b);
  const split = left + right;
  if (Math.abs(split - whole) <= tolerance || depth >= 40) return split;
  return refine(f, a, mid, left, tolerance / 2, depth + 1) + refine(f, mid, b, right, tolerance / 2, depth + 1);
}
