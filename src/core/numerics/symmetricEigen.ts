/**
 * Eigenvalues and eigenvectors of a small real symmetric matrix by the cyclic Jacobi method
 * (Golub & Van Loan, Matrix Computations, 4th ed., section 8.5): plane rotations annihilate the
 * off-diagonal entries until their sum of squares is below 1e-30 of the matrix's. Accurate to a few
 * units in the last place for the k x k matrices (k up to a few tens) met here.
 */
import type { Matrix } from "./linearAlgebra.js";
import { eliminationKernel, MATRIX_KERNEL_SIZE, type MatrixKernel, matrixKernel, writeMatrix } from "./matrixKernel.js";

export interface SymmetricEigen {
  /** Eigenvalues in decreasing order. */
  readonly values: number[];
  /** vectors[j] is the unit eigenvector of values[j]. */
  readonly vectors: number[][];
}

/**
 * With `useKernel` (the default) and n up to MATRIX_KERNEL_SIZE, the sweeps run in the WebAssembly
 * kernel (matrixKernel.ts: the same bits).
 */
export function symmetricEigen(input: readonly (readonly number[])[], useKernel = true): SymmetricEigen {
  const n = input.length;
  const kernel = useKernel && n <= MATRIX_KERNEL_SIZE ? matrixKernel() : null;
  if (kernel !== null) {
    writeMatrix(kernel.a, input);
    return eigenInKernel(kernel, n);
  }
  const a: Matrix = input.map((row) => [...row]);
  const v: Matrix = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0)));
  let total = 0;
  for (const row of a) for (const x of row) total += x * x;
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0;
    for (let p = 0; p < n; p++) for (let q = p + 1; q < n; q++) off += a[p]![q]! * a[p]![q]!;
    if (off <= 1e-30 * total || off === 0) break;
    for (let p = 0; p < n; p++) {
      for (let q = p + 1; q < n; q++) {
        const apq = a[p]![q]!;
        if (apq === 0) continue;
        const theta = (a[q]![q]! - a[p]![p]!) / (2 * apq);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = a[k]![p]!;
          const akq = a[k]![q]!;
          a[k]![p] = c * akp - s * akq;
          a[k]![q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = a[p]![k]!;
          const aqk = a[q]![k]!;
          a[p]![k] = c * apk - s * aqk;
          a[q]![k] = s * apk + c * aqk;
        }
        for (let k = 0; k < n; k++) {
          const vkp = v[k]![p]!;
          const vkq = v[k]![q]!;
          v[k]![p] = c * vkp - s * vkq;
          v[k]![q] = s * vkp + c * vkq;
        }
      }
    }
  }
  return inDecreasingOrder(
    n,
    (i) => a[i]![i]!,
    (k, i) => v[k]![i]!,
  );
}

/** The sweeps on the n x n matrix already in the kernel's A, and the result as symmetricEigen gives it. */
export function eigenInKernel(kernel: MatrixKernel, n: number): SymmetricEigen {
  kernel.jacobi(n);
  return inDecreasingOrder(
    n,
    (i) => kernel.a[i * n + i]!,
    (k, i) => kernel.v[k * n + i]!,
  );
}

/** The eigenvalues (the swept diagonal) in decreasing order and their vectors (columns of V) with them. */
function inDecreasingOrder(n: number, diagonal: (i: number) => number, rotation: (k: number, i: number) => number): SymmetricEigen {
  const order = Array.from({ length: n }, (_, i) => i).sort((i, j) => diagonal(j) - diagonal(i));
  return { values: order.map(diagonal), vectors: order.map((i) => Array.from({ length: n }, (_, k) => rotation(k, i))) };
}

/**
 * log det and inverse of a symmetric positive definite matrix by Cholesky; null when not (numerically)
 * positive definite. With `useKernel` (the default) and n up to MATRIX_KERNEL_SIZE, the factor and the
 * inverse come from the WebAssembly kernel (matrixKernel.ts: the same bits) and log det from its
 * diagonal here, in the same order.
 */
export function choleskyLogDetInverse(a: readonly (readonly number[])[], useKernel = true): { logDet: number; inverse: Matrix } | null {
  const n = a.length;
  const kernel = useKernel && n <= MATRIX_KERNEL_SIZE ? eliminationKernel() : null;
  if (kernel !== null) {
    writeMatrix(kernel.a, a);
    if (!kernel.cholesky(n)) return null;
    let logDet = 0;
    for (let j = 0; j < n; j++) logDet += 2 * Math.log(kernel.b[j * n + j]!);
    return { logDet, inverse: Array.from({ length: n }, (_, i) => Array.from(kernel.a.subarray(i * n, (i + 1) * n))) };
  }
  const l: Matrix = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  let logDet = 0;
  for (let j = 0; j < n; j++) {
    let d = a[j]![j]!;
    for (let k = 0; k < j; k++) d -= l[j]![k]! * l[j]![k]!;
    // Numerically singular (a pivot lost to rounding against its diagonal entry) counts as not positive definite.
    if (!(d > 1e-12 * a[j]![j]!)) return null;
    const root = Math.sqrt(d);
    l[j]![j] = root;
    logDet += 2 * Math.log(root);
    for (let i = j + 1; i < n; i++) {
      let s = a[i]![j]!;
      for (let k = 0; k < j; k++) s -= l[i]![k]! * l[j]![k]!;
      l[i]![j] = s / root;
    }
  }
  // L^-1 by forward substitution, then A^-1 = L^-T L^-1.
  const li: Matrix = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let c = 0; c < n; c++) {
    for (let i = c; i < n; i++) {
      let s = i === c ? 1 : 0;
      for (let k = c; k < i; k++) s -= l[i]![k]! * li[k]![c]!;
      li[i]![c] = s / l[i]![i]!;
    }
  }
  const inverse: Matrix = Array.from({ length: n }, (_, i) =>
    Array.from({ length: n }, (_, j) => {
      let s = 0;
      for (let k = Math.max(i, j); k < n; k++) s += li[k]![i]! * li[k]![j]!;
      return s;
    }),
  );
  return { logDet, inverse };
}
