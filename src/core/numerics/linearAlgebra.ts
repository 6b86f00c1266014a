/**
 * Small dense linear algebra for the inference code (k x k with k up to about 10).
 *
 * ## Conventions
 * A matrix is an array of rows (`number[][]`); a data set of k series is an array of k columns
 * (`Float64Array[]`, one per series), the layout of a design matrix or of estimating functions.
 * Linear systems are solved by Gaussian elimination with partial (row) pivoting, which is backward
 * stable in practice for the small, well-scaled systems met here (Golub & Van Loan, Matrix
 * Computations, 4th ed., section 3.4). A zero pivot throws: a singular system is a programming or
 * data error the caller must have excluded (constant regressors, collinear columns).
 */
import { eliminationKernel, MATRIX_KERNEL_SIZE, writeMatrix } from "./matrixKernel.js";

export type Matrix = number[][];

/** Systems from this many rows are solved in the WebAssembly kernel (solveOrNull). */
const KERNEL_FROM = 6;

/** The n x n identity. */
export function identity(n: number): Matrix {
  return Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0)));
}

export function transpose(a: readonly (readonly number[])[]): Matrix {
  const rows = a.length;
  const cols = rows === 0 ? 0 : a[0]!.length;
  return Array.from({ length: cols }, (_, j) => Array.from({ length: rows }, (_, i) => a[i]![j]!));
}

/** a b for conformable matrices. */
export function multiply(a: readonly (readonly number[])[], b: readonly (readonly number[])[]): Matrix {
  const inner = b.length;
  const cols = inner === 0 ? 0 : b[0]!.length;
  return a.map((row) => {
    const out = new Array<number>(cols).fill(0);
    for (let l = 0; l < inner; l++) {
      const factor = row[l]!;
      const bRow = b[l]!;
      for (let j = 0; j < cols; j++) out[j] = out[j]! + factor * bRow[j]!;
    }
    return out;
  });
}

/** a b a' (a "sandwich"), e.g. a covariance transformed by a Jacobian. */
export function sandwich(a: readonly (readonly number[])[], b: readonly (readonly number[])[]): Matrix {
  return multiply(multiply(a, b), transpose(a));
}

/** x' m y for vectors x, y and a matrix m. */
export function bilinear(x: readonly number[], m: readonly (readonly number[])[], y: readonly number[]): number {
  let total = 0;
  for (let i = 0; i < x.length; i++) {
    const row = m[i]!;
    let inner = 0;
    for (let j = 0; j < y.length; j++) inner += row[j]! * y[j]!;
    total += x[i]! * inner;
  }
  return total;
}

/** Elementwise a + scale b. */
export function addScaled(a: readonly (readonly number[])[], b: readonly (readonly number[])[], scale = 1): Matrix {
  return a.map((row, i) => row.map((value, j) => value + scale * b[i]![j]!));
}

/** Every entry times `factor`. */
export function scale(a: readonly (readonly number[])[], factor: number): Matrix {
  return a.map((row) => row.map((value) => value * factor));
}

/**
 * Solves a x = b for x, with b holding one or more right-hand sides as columns (b is n x m).
 * @throws RangeError if a is singular (an exactly zero pivot after pivoting).
 */
export function solve(a: readonly (readonly number[])[], b: readonly (readonly number[])[]): Matrix {
  const x = solveOrNull(a, b, 0);
  if (x === null) throw new RangeError("solve: matrix is singular");
  return x;
}

/**
 * `solve`, or null when a pivot (after partial pivoting) is at most `tolerance` times the largest
 * absolute entry of a: a singular, or with a positive tolerance a numerically singular, system.
 */
export function solveOrNull(
  a: readonly (readonly number[])[],
  b: readonly (readonly number[])[],
  tolerance: number,
  useKernel = true,
): Matrix | null {
  const n = a.length;
  const m = n === 0 ? 0 : b[0]!.length;
  // From 6 rows, the elimination in the WebAssembly kernel (matrixKernel.ts: the same bits); smaller
  // systems, solved many times a run, are optimised by V8 before the copies would pay.
  const kernel = useKernel && n >= KERNEL_FROM && n <= MATRIX_KERNEL_SIZE && m <= MATRIX_KERNEL_SIZE ? eliminationKernel() : null;
  if (kernel !== null) {
    writeMatrix(kernel.a, a);
    for (let i = 0; i < n; i++) kernel.b.set(b[i]!, i * m);
    if (!kernel.solve(n, m, tolerance)) return null;
    return Array.from({ length: n }, (_, i) => Array.from(kernel.x.subarray(i * m, (i + 1) * m)));
  }
  const lu = a.map((row) => [...row]);
  const rhs = b.map((row) => [...row]);
  let largest = 0;
  for (const row of a) for (const value of row) largest = Math.max(largest, Math.abs(value));
  const smallest = tolerance * largest;
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(lu[r]![col]!) > Math.abs(lu[pivot]![col]!)) pivot = r;
    if (!(Math.abs(lu[pivot]![col]!) > smallest)) return null;
    if (pivot !== col) {
      [lu[pivot], lu[col]] = [lu[col]!, lu[pivot]!];
      [rhs[pivot], rhs[col]] = [rhs[col]!, rhs[pivot]!];
    }
    const pivotRow = lu[col]!;
    const pivotRhs = rhs[col]!;
    for (let r = col + 1; r < n; r++) {
      const row = lu[r]!;
      const factor = row[col]! / pivotRow[col]!;
      if (factor === 0) continue;
      for (let j = col; j < n; j++) row[j] = row[j]! - factor * pivotRow[j]!;
      const target = rhs[r]!;
      for (let j = 0; j < m; j++) target[j] = target[j]! - factor * pivotRhs[j]!;
    }
  }
  const x: Matrix = Array.from({ length: n }, () => new Array<number>(m).fill(0));
  for (let r = n - 1; r >= 0; r--) {
    const row = lu[r]!;
    for (let j = 0; j < m; j++) {
      let value = rhs[r]![j]!;
      for (let c = r + 1; c < n; c++) value -= row[c]! * x[c]![j]!;
      x[r]![j] = value / row[r]!;
    }
  }
  return x;
}

/** The inverse of a square non-singular matrix. */
export function inverse(a: readonly (readonly number[])[]): Matrix {
  return solve(a, identity(a.length));
}

/** Symmetrises rounding noise away: (a + a') / 2. */
export function symmetrise(a: readonly (readonly number[])[]): Matrix {
  return a.map((row, i) => row.map((value, j) => (value + a[j]![i]!) / 2));
}

/** X'Y for data sets given as columns: entry (i, j) = sum_t x_i,t y_j,t over rows [from, to). */
export function crossColumns(
  x: readonly ArrayLike<number>[],
  y: readonly ArrayLike<number>[],
  from = 0,
  to = x.length === 0 ? 0 : x[0]!.length,
): Matrix {
  return x.map((xi) =>
    y.map((yj) => {
      let total = 0;
      for (let t = from; t < to; t++) total += xi[t]! * yj[t]!;
      return total;
    }),
  );
}
