/**
 * The bivariate normal distribution: P(X > h, Y > k) for standard normal X, Y with correlation r
 * (docs/methods.md §30).
 *
 * Method: Drezner & Wesolowsky (1990) as refined by Genz (2004), "Numerical computation of
 * rectangular bivariate and trivariate normal and t probabilities", Statistics and Computing 14,
 * 251-260: Gauss-Legendre quadrature of Plackett's integral over the arcsine of the correlation for
 * |r| < 0.925, and of a series-corrected form of it near |r| = 1. The quadrature has 6, 12 or 20 points
 * as |r| grows; the nodes are computed here (Newton's method on the Legendre polynomial) rather than
 * copied. Accuracy about 1e-15 absolute (Genz); checked against mpmath in test/fixtures/bivariate-normal.
 */

import { normalCdf } from "./normal.js";

/** Gauss-Legendre nodes in (0, 1) (the positive half of a symmetric rule) and their weights. */
function gaussLegendre(points: number): { nodes: number[]; weights: number[] } {
  const nodes: number[] = [];
  const weights: number[] = [];
  for (let i = 1; i <= points / 2; i++) {
    // The i-th largest root, from the usual Chebyshev-like start.
    let x = Math.cos((Math.PI * (i - 0.25)) / (points + 0.5));
    let derivative = 0;
    for (let iteration = 0; iteration < 100; iteration++) {
      let p0 = 1;
      let p1 = x;
      for (let k = 2; k <= points; k++) {
        const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      derivative = (points * (x * p1 - p0)) / (x * x - 1);
      const step = p1 / derivative;
      x -= step;
      if (Math.abs(step) < 1e-16) break;
    }
    nodes.push(x);
    weights.push(2 / ((1 - x * x) * derivative * derivative));
  }
  return { nodes, weights };
}

const rules = [gaussLegendre(6), gaussLegendre(12), gaussLegendre(20)] as const;

/** P(X > h, Y > k), X and Y standard normal with correlation r in [-1, 1]. */
export function bivariateNormalUpper(h: number, k: number, r: number): number {
  if (Number.isNaN(h) || Number.isNaN(k) || !(r >= -1 && r <= 1)) return Number.NaN;
  if (r === 1) return normalCdf(-Math.max(h, k));
  if (r === -1) return Math.max(0, normalCdf(-h) - normalCdf(k));
  const { nodes, weights } = Math.abs(r) < 0.3 ? rules[0] : Math.abs(r) < 0.75 ? rules[1] : rules[2];
  let hk = h * k;
  let total = 0;
  if (Math.abs(r) < 0.925) {
    const hs = (h * h + k * k) / 2;
    const asr = Math.asin(r);
    for (let i = 0; i < nodes.length; i++) {
      for (let sign = -1; sign <= 1; sign += 2) {
        const sn = Math.sin((asr * (sign * nodes[i]! + 1)) / 2);
        total += weights[i]! * Math.exp((sn * hk - hs) / (1 - sn * sn));
      }
    }
    return clampProbability((total * asr) / (4 * Math.PI) + normalCdf(-h) * normalCdf(-k));
  }
  let kk = k;
  if (r < 0) {
    kk = -kk;
    hk = -hk;
  }
  const as = (1 - r) * (1 + r);
  let a = Math.sqrt(as);
  const bs = (h - kk) ** 2;
  const c = (4 - hk) / 8;
  const d = (12 - hk) / 16;
  let asr = -(bs / as + hk) / 2;
  if (asr > -100) total = a * Math.exp(asr) * (1 - (c * (bs - as) * (1 - (d * bs) / 5)) / 3 + (c * d * as * as) / 5);
  if (-hk < 100) {
    const b = Math.sqrt(bs);
    total -= Math.exp(-hk / 2) * Math.sqrt(2 * Math.PI) * normalCdf(-b / a) * b * (1 - (c * bs * (1 - (d * bs) / 5)) / 3);
  }
  a /= 2;
  for (let i = 0; i < nodes.length; i++) {
    for (let sign = -1; sign <= 1; sign += 2) {
      const xs = (a * (sign * nodes[i]! + 1)) ** 2;
      const rs = Math.sqrt(1 - xs);
      asr = -(bs / xs + hk) / 2;
      if (asr > -100) {
        total += a * weights[i]! * Math.exp(asr) * (Math.exp((-hk * (1 - rs)) / (2 * (1 + rs))) / rs - (1 + c * xs * (1 + d * xs)));
      }
    }
  }
  total = -total / (2 * Math.PI);
  if (r > 0) return clampProbability(total + normalCdf(-Math.max(h, kk)));
  total = -total;
  if (kk > h) total += normalCdf(kk) - normalCdf(h);
  return clampProbability(total);
}

/** P(X <= h, Y <= k): by symmetry, the upper probability at (-h, -k). */
export function bivariateNormalCdf(h: number, k: number, r: number): number {
  return bivariateNormalUpper(-h, -k, r);
}

function clampProbability(p: number): number {
  return Math.min(1, Math.max(0, p));
}
