/**
 * Maximum-likelihood one-factor analysis of a k x k sample covariance matrix (docs/methods.md §31).
 *
 * Model: Sigma = lambda lambda' + Psi, Psi diagonal. For fixed Psi the likelihood is maximised by
 * lambda = Psi^(1/2) v sqrt(max(theta - 1, 0)), with theta, v the largest eigenvalue and its unit
 * eigenvector of Psi^(-1/2) S Psi^(-1/2) (Joreskog 1967; Lawley & Maxwell 1971, ch. 4); the noise
 * variances then follow the fixed point Psi = diag(S - lambda lambda'), a noise variance that would fall
 * to or below 0 being held at a floor of 1e-10 of its series' variance (a Heywood case). Iterates until
 * no noise variance moves by more than 1e-15 of its series' variance, for at most 20,000 steps.
 *
 * The discrepancy is F = log|Sigma| + tr(S Sigma^-1) - log|S| - k, the likelihood-ratio statistic
 * Bartlett's (n - 1 - (2k + 5)/6 - 2/3) F (Lawley & Maxwell 1971, section 4.6), on k(k - 3)/2 degrees
 * of freedom. Standard errors come from the Fisher information of (lambda, Psi) for a Wishart S with
 * n - 1 degrees of freedom, I_ab = (n - 1)/2 tr(Sigma^-1 dSigma_a Sigma^-1 dSigma_b) (the caller
 * carries them to the normalised loadings by the delta method).
 */
import { type Matrix, solveOrNull } from "../numerics/linearAlgebra.js";
import { MATRIX_KERNEL_SIZE, type MatrixKernel, matrixKernel, writeMatrix } from "../numerics/matrixKernel.js";
import { choleskyLogDetInverse, eigenInKernel, symmetricEigen } from "../numerics/symmetricEigen.js";

export const heywoodFloor = 1e-10;
const tolerance = 1e-15;
const maxIterations = 20_000;
const nearBoundary = 1e-3;

export interface OneFactorFit {
  /** Unnormalised loadings (factor variance 1), sign chosen by the caller. */
  readonly lambda: number[];
  readonly psi: number[];
  /** Indices of the noise variances held at the floor. */
  readonly heywood: number[];
  readonly converged: boolean;
  readonly iterations: number;
  /** The ML discrepancy F at the estimate. */
  readonly discrepancy: number;
  /** Covariance of (lambda, psi) from the inverse information; null when the information is singular. */
  readonly covariance: Matrix | null;
}

/**
 * The ML fit of `s` (positive definite, k >= 3) from `n` observations; null when `s` is not positive
 * definite. With `useKernel` (the default) and k up to MATRIX_KERNEL_SIZE, the loadings' scaled matrix,
 * power iteration and Jacobi sweeps and the candidates' Cholesky factors run in the WebAssembly kernel
 * (numerics/matrixKernel.ts: the same bits).
 */
export function fitOneFactor(s: readonly (readonly number[])[], n: number, useKernel = true): OneFactorFit | null {
  const k = s.length;
  const sample = choleskyLogDetInverse(s, useKernel);
  if (sample === null) return null;
  const kernel = useKernel && k <= MATRIX_KERNEL_SIZE ? matrixKernel() : null;
  if (kernel !== null) writeMatrix(kernel.s, s);
  const loadingsGiven = (psi: readonly number[], start: readonly number[] | null) =>
    kernel === null ? loadingsInJs(s, psi, start) : loadingsInKernel(kernel, psi, start);
  // Starting values of Joreskog (1967): psi_i = (1 - 1/(2k)) / (S^-1)_ii.
  let psi = s.map((_, i) => (1 - 1 / (2 * k)) / sample.inverse[i]![i]!);
  let lambda = new Array<number>(k).fill(0);
  let iterations = 0;
  let converged = false;
  let vector: readonly number[] | null = null;
  for (; iterations < maxIterations; ) {
    iterations++;
    ({ lambda, vector } = loadingsGiven(psi, vector));
    const next = s.map((row, i) => Math.max(row[i]! - lambda[i]! * lambda[i]!, heywoodFloor * row[i]!));
    const moved = Math.max(...next.map((p, i) => Math.abs(p - psi[i]!) / s[i]![i]!));
    psi = next;
    if (moved <= tolerance) {
      converged = true;
      break;
    }
    // Creeping towards a noise variance of 0: the boundary solutions below settle it.
    if (iterations >= 2_000 && psi.some((p, i) => p < nearBoundary * s[i]![i]!)) break;
  }
  lambda = loadingsGiven(psi, null).lambda;
  let best: Candidate | null = evaluate(s, sample.logDet, lambda, psi, converged, useKernel);
  // On the boundary psi_i = 0 the factor is portfolio i itself (Lawley & Maxwell 1971, section 5.1):
  // lambda = S e_i / sqrt(S_ii), psi_j = S_jj - S_ji^2 / S_ii. Kept when it fits at least as well.
  for (let i = 0; i < k; i++) {
    const root = Math.sqrt(s[i]![i]!);
    const edgeLambda = s.map((row) => row[i]! / root);
    const edgePsi = s.map((row, j) => (j === i ? heywoodFloor * row[j]! : row[j]! - edgeLambda[j]! * edgeLambda[j]!));
    if (edgePsi.some((p, j) => j !== i && !(p > heywoodFloor * s[j]![j]!))) continue;
    const edge = evaluate(s, sample.logDet, edgeLambda, edgePsi, true, useKernel);
    if (edge !== null && (best === null || edge.discrepancy <= best.discrepancy + 1e-14)) best = edge;
  }
  if (best === null) return null;
  ({ lambda, psi } = best);
  converged = best.converged;
  const heywood = psi.flatMap((p, i) => (p <= heywoodFloor * s[i]![i]! * (1 + 1e-9) ? [i] : []));
  const discrepancy = best.discrepancy;
  const covariance = inverseInformation(best.inverse, lambda, n, useKernel);
  return { lambda, psi, heywood, converged, iterations, discrepancy, covariance };
}

interface Candidate {
  readonly lambda: number[];
  readonly psi: number[];
  readonly discrepancy: number;
  readonly inverse: Matrix;
  readonly converged: boolean;
}

function evaluate(
  s: readonly (readonly number[])[],
  logDetS: number,
  lambda: number[],
  psi: number[],
  converged: boolean,
  useKernel: boolean,
): Candidate | null {
  const k = s.length;
  const sigma = s.map((row, i) => row.map((_, j) => lambda[i]! * lambda[j]! + (i === j ? psi[i]! : 0)));
  const model = choleskyLogDetInverse(sigma, useKernel);
  if (model === null) return null;
  let trace = 0;
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) trace += s[i]![j]! * model.inverse[j]![i]!;
  return { lambda, psi, discrepancy: Math.max(model.logDet + trace - logDetS - k, 0), inverse: model.inverse, converged };
}

/**
 * lambda maximising the likelihood for fixed psi, and the unit eigenvector it came from. From a
 * previous step's eigenvector (`start`) by power iteration, which the large gap between the leading
 * eigenvalue and the rest makes quick; from scratch (or when it does not settle) by Jacobi. In
 * JavaScript here; loadingsInKernel below does the same in the kernel.
 */
function loadingsInJs(
  s: readonly (readonly number[])[],
  psi: readonly number[],
  start: readonly number[] | null,
): { lambda: number[]; vector: number[] } {
  const root = psi.map(Math.sqrt);
  const scaled = s.map((row, i) => row.map((x, j) => x / (root[i]! * root[j]!)));
  const leading = (start === null ? null : powerIteration(scaled, start)) ?? jacobiLeading(scaled);
  return loadingsFrom(leading, root);
}

/** loadingsInJs with the sample covariance already in the kernel's S: the same steps there. */
function loadingsInKernel(
  kernel: MatrixKernel,
  psi: readonly number[],
  start: readonly number[] | null,
): { lambda: number[]; vector: number[] } {
  const k = psi.length;
  const root = psi.map(Math.sqrt);
  kernel.roots.set(root);
  kernel.scale(k);
  let leading: Leading | null = null;
  if (start !== null) {
    kernel.x.set(start);
    if (kernel.power(k)) leading = { value: kernel.state[0]!, vector: Array.from(kernel.x.subarray(0, k)) };
  }
  if (leading === null) {
    const { values, vectors } = eigenInKernel(kernel, k);
    leading = { value: values[0]!, vector: vectors[0]! };
  }
  return loadingsFrom(leading, root);
}

function loadingsFrom(leading: Leading, root: readonly number[]): { lambda: number[]; vector: number[] } {
  const size = Math.sqrt(Math.max(leading.value - 1, 0));
  return { lambda: leading.vector.map((v, i) => root[i]! * v * size), vector: leading.vector };
}

interface Leading {
  readonly value: number;
  readonly vector: number[];
}

function jacobiLeading(a: readonly (readonly number[])[]): Leading {
  const { values, vectors } = symmetricEigen(a, false);
  return { value: values[0]!, vector: vectors[0]! };
}

/**
 * The leading eigenvalue (Rayleigh quotient) and unit eigenvector of the symmetric `a` by power
 * iteration from `start`: until the vector moves by at most 4 units in the last place, or stops
 * shrinking its moves once they are within rounding (1e-13); null after 100 steps.
 */
function powerIteration(a: readonly (readonly number[])[], start: readonly number[]): Leading | null {
  const k = a.length;
  let v = [...start];
  let previous = Number.POSITIVE_INFINITY;
  for (let step = 0; step < 100; step++) {
    const next = new Array<number>(k);
    let norm = 0;
    for (let i = 0; i < k; i++) {
      const row = a[i]!;
      let sum = 0;
      for (let j = 0; j < k; j++) sum += row[j]! * v[j]!;
      next[i] = sum;
      norm += sum * sum;
    }
    norm = Math.sqrt(norm);
    let moved = 0;
    for (let i = 0; i < k; i++) {
      next[i] = next[i]! / norm;
      moved = Math.max(moved, Math.abs(next[i]! - v[i]!));
    }
    v = next;
    if (moved <= 4 * Number.EPSILON || (moved >= previous && moved < 1e-13)) return { value: rayleigh(a, v), vector: v };
    previous = moved;
  }
  return null;
}

function rayleigh(a: readonly (readonly number[])[], v: readonly number[]): number {
  let value = 0;
  for (let i = 0; i < v.length; i++) {
    const row = a[i]!;
    let sum = 0;
    for (let j = 0; j < v.length; j++) sum += row[j]! * v[j]!;
    value += v[i]! * sum;
  }
  return value;
}

/**
 * ((n - 1)/2 tr(P A P B))^-1 over the parameters (lambda_1..k, psi_1..k), P = Sigma^-1. With
 * dSigma/dlambda_i = e_i lambda' + lambda e_i' and dSigma/dpsi_i = e_i e_i', g = P lambda and
 * q = lambda' P lambda, the traces are in closed form (expanding each product into rank-one terms):
 * tr(P A_i P A_j) = 2 (q P_ij + g_i g_j), tr(P A_i P E_j) = 2 g_j P_ij, tr(P E_i P E_j) = P_ij^2.
 */
function inverseInformation(p: Matrix, lambda: readonly number[], n: number, useKernel: boolean): Matrix | null {
  const k = lambda.length;
  const g = p.map((row) => row.reduce((sum, x, j) => sum + x * lambda[j]!, 0));
  const q = g.reduce((sum, x, i) => sum + x * lambda[i]!, 0);
  const half = (n - 1) / 2;
  const size = 2 * k;
  const information: Matrix = Array.from({ length: size }, () => new Array<number>(size).fill(0));
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      const pij = p[i]![j]!;
      information[i]![j] = half * 2 * (q * pij + g[i]! * g[j]!);
      information[i]![k + j] = information[k + j]![i] = half * 2 * g[j]! * pij;
      information[k + i]![k + j] = half * pij * pij;
    }
  const identity = Array.from({ length: size }, (_, i) => Array.from({ length: size }, (_, j) => (i === j ? 1 : 0)));
  return solveOrNull(information, identity, 1e-12, useKernel);
}
