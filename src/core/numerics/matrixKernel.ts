/**
 * The one-factor fit's small dense passes in WebAssembly (matrixKernel.wat): the Jacobi sweeps of
 * symmetricEigen, and loadingsGiven's scaled matrix and power iteration (models/factorModelFit.ts).
 * and symmetricEigen.ts choleskyLogDetInverse (the fit's candidates' discrepancies). A fit calls them a few dozen times a run, too few for V8 to optimise the JavaScript loops, which it
 * then runs in its interpreter (the fit took 15-22 ms at k = 10). Each kernel function does its
 * JavaScript twin's arithmetic in the same order, so the results are the same bits
 * (test/core/numerics/matrixKernel.test.ts); the twins stay as the fallback (the kernel is null where
 * WebAssembly is missing) and for matrices larger than MATRIX_KERNEL_SIZE.
 */
import { kernelInstance } from "./seriesKernel.js";
import { eliminationKernelWasm } from "./eliminationKernelWasm.js";
import { matrixKernelWasm } from "./matrixKernelWasm.js";

/** The largest n of the kernel's n x n matrices. */
export const MATRIX_KERNEL_SIZE = 64;

const A_AT = 1024;
const V_AT = 33_792;
const S_AT = 66_560;
const X_AT = 99_328;
const R_AT = 100_352;
/** eliminationKernel.wat's second and third matrices. */
const B_AT = 33_792;
const X_AT_ELIMINATION = 66_560;
const CELLS = MATRIX_KERNEL_SIZE * MATRIX_KERNEL_SIZE;

export interface MatrixKernel {
  /** The working matrix A (row-major, n x n at its start). */
  readonly a: Float64Array;
  /** The rotations V of `jacobi`. */
  readonly v: Float64Array;
  /** The sample covariance S of a fit, read by `scale`. */
  readonly s: Float64Array;
  /** The power iteration's vector (its start, then its result). */
  readonly x: Float64Array;
  /** The roots R of `scale`. */
  readonly roots: Float64Array;
  /** The state: the Rayleigh quotient of `power` at 0. */
  readonly state: Float64Array;
  /** symmetricEigen's sweeps on A; its diagonal then holds the eigenvalues, V's columns the vectors. */
  jacobi(n: number): void;
  /** A = S_ij / (R_i R_j). */
  scale(n: number): void;
  /** powerIteration on A from X: true with the vector in X and the quotient in state[0], or false. */
  power(n: number): boolean;
}

/** eliminationKernel.wat: Cholesky factors and linear systems. */
export interface EliminationKernel {
  /** A (row-major, n x n at its start): the matrix factored or solved; the inverse of `cholesky`. */
  readonly a: Float64Array;
  /** L of `cholesky`, or the right-hand sides B (n x m) of `solve`. */
  readonly b: Float64Array;
  /** The solution X (n x m) of `solve`. */
  readonly x: Float64Array;
  /** choleskyLogDetInverse on A: false when not numerically positive definite; else true, L in `b`, A^-1 in `a`. */
  cholesky(n: number): boolean;
  /** solveOrNull for A and B: true with X in `x`, or false. */
  solve(n: number, m: number, tolerance: number): boolean;
}

let kernel: MatrixKernel | null | undefined;

/** The kernel, or null (WebAssembly unavailable: use the JavaScript loops). */
export function matrixKernel(): MatrixKernel | null {
  // Null is kept too: where WebAssembly is missing, it is not tried again.
  if (kernel === undefined)
    kernel = kernelInstance(matrixKernelWasm, (exports, { buffer }) => {
      const f = exports as Record<string, (n: number) => number>;
      return {
        a: new Float64Array(buffer, A_AT, CELLS),
        v: new Float64Array(buffer, V_AT, CELLS),
        s: new Float64Array(buffer, S_AT, CELLS),
        x: new Float64Array(buffer, X_AT, MATRIX_KERNEL_SIZE),
        roots: new Float64Array(buffer, R_AT, MATRIX_KERNEL_SIZE),
        state: new Float64Array(buffer, 0, 32),
        jacobi: (n) => void f.jacobi!(n),
        scale: (n) => void f.scale!(n),
        power: (n) => f.power!(n) === 1,
      };
    });
  return kernel;
}

let elimination: EliminationKernel | null | undefined;

/** The elimination kernel, or null (WebAssembly unavailable: use the JavaScript loops). */
export function eliminationKernel(): EliminationKernel | null {
  if (elimination === undefined)
    elimination = kernelInstance(eliminationKernelWasm, (exports, { buffer }) => {
      const cholesky = exports.cholesky as (n: number) => number;
      const solve = exports.solve as (n: number, m: number, tolerance: number) => number;
      return {
        a: new Float64Array(buffer, A_AT, CELLS),
        b: new Float64Array(buffer, B_AT, CELLS),
        x: new Float64Array(buffer, X_AT_ELIMINATION, CELLS),
        cholesky: (n) => cholesky(n) === 1,
        solve: (n, m, tolerance) => solve(n, m, tolerance) === 1,
      };
    });
  return elimination;
}

/** Writes the n x n `matrix` row by row into `into`. */
export function writeMatrix(into: Float64Array, matrix: readonly (readonly number[])[]): void {
  const n = matrix.length;
  for (let i = 0; i < n; i++) {
    const row = matrix[i]!;
    for (let j = 0; j < n; j++) into[i * n + j] = row[j]!;
  }
}
