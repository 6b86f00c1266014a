/**
 * Ordinary least squares with k regressors, and the classical covariance of the coefficients.
 *
 * ## Conventions
 * The design is given as k columns (the intercept, if any, is a column of ones). Coefficients solve
 * the normal equations X'X b = X'y by Gaussian elimination with partial pivoting (linearAlgebra.ts),
 * adequate for the small, well-conditioned designs of this project (a CAPM regression, the R sandwich
 * and statsmodels reference regressions of docs/methods.md §8). Residuals are formed in a second
 * pass. Classical covariance s^2 (X'X)^{-1} with s^2 = e'e / (n - k), as R's vcov(lm) (Greene,
 * Econometric Analysis, ch. 4).
 */

import { borrowSeries } from "./scratch.js";
import { crossColumns, inverse, scale, solve, type Matrix } from "./linearAlgebra.js";
import { CHUNK } from "./seriesLoops.js";
import { inChunks, seriesKernel } from "./seriesKernel.js";

export interface LeastSquaresFit {
  readonly coefficients: number[];
  readonly residuals: Float64Array;
  /** (X'X)^{-1}, the "bread" of every sandwich covariance. */
  readonly inverseCrossProduct: Matrix;
}

/** Regresses y on the columns of `design`. */
export function leastSquares(design: readonly Float64Array[], y: ArrayLike<number>): LeastSquaresFit {
  const n = y.length;
  for (const column of design) {
    if (column.length !== n) throw new RangeError("leastSquares: design and response differ in length");
  }
  const xtx = crossColumns(design, design);
  const xty = crossColumns(design, [y]);
  const coefficients = solve(xtx, xty).map((row) => row[0]!);
  const residuals = borrowSeries(n); // every element is written below
  for (let t = 0; t < n; t++) {
    let fitted = 0;
    for (let j = 0; j < design.length; j++) fitted += design[j]![t]! * coefficients[j]!;
    residuals[t] = y[t]! - fitted;
  }
  return { coefficients, residuals, inverseCrossProduct: inverse(xtx) };
}

/** s^2 (X'X)^{-1}, s^2 = e'e / (n - k): the homoskedastic covariance of the OLS coefficients. */
export function classicalCovariance(design: readonly Float64Array[], residuals: Float64Array): Matrix {
  const n = residuals.length;
  let ssr = 0;
  for (let t = 0; t < n; t++) ssr += residuals[t]! * residuals[t]!;
  return scale(inverse(crossColumns(design, design)), ssr / (n - design.length));
}

/**
 * `leastSquares([ones, x], y)` without the column of ones: the same arithmetic, term by term (1 * v is
 * v exactly; the sums run in the same order), so the same bits, in one pass for the cross products
 * instead of three and no series of ones. The CAPM regressions of the uncertainty take this form.
 */
export function interceptLeastSquares(x: ArrayLike<number>, y: ArrayLike<number>, useKernel = true): LeastSquaresFit {
  const n = y.length;
  if (x.length !== n) throw new RangeError("leastSquares: design and response differ in length");
  // The WebAssembly kernel (seriesKernel.ts: the same bits) at every length, chunk by chunk with the
  // sums carried in its state: a JavaScript loop runs unoptimised for its first tens of thousands of
  // rows, making a heap number of every double.
  const kernel = useKernel ? seriesKernel() : null;
  // sx, sxx, sy, sxy, in chunks by a small function V8 optimises whole (seriesLoops.ts).
  const sums = new Float64Array(4);
  if (kernel !== null) {
    kernel.state.fill(0, 0, 4);
    inChunks(kernel, { x, y, rates: null }, (_from, count) => kernel.crossSums(count));
    sums.set(kernel.state.subarray(0, 4));
  } else for (let from = 0; from < n; from += CHUNK) crossChunk(x, y, from, Math.min(n, from + CHUNK), sums);
  const [sx, sxx, sy, sxy] = sums as unknown as [number, number, number, number];
  const xtx = [
    [n, sx],
    [sx, sxx],
  ];
  const [a, b] = solve(xtx, [[sy], [sxy]]).map((row) => row[0]!) as [number, number];
  const residuals = borrowSeries(n); // every element is written below
  if (kernel !== null) {
    inChunks(kernel, { x, y, rates: null }, (from, count) => {
      kernel.interceptResiduals(count, a, b);
      residuals.set(kernel.columns[2].subarray(0, count), from);
    });
  } else for (let from = 0; from < n; from += CHUNK) interceptResidualChunk(x, y, a, b, residuals, from, Math.min(n, from + CHUNK));
  return { coefficients: [a, b], residuals, inverseCrossProduct: inverse(xtx) };
}

/** residuals[t] = y[t] - (0 + a + x[t] b), in leastSquares' order (0 + 1 * a first: a signed zero comes out the same). */
function interceptResidualChunk(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  a: number,
  b: number,
  residuals: Float64Array,
  from: number,
  to: number,
): void {
  for (let t = from; t < to; t++) {
    let fitted = 0;
    fitted += a;
    fitted += x[t]! * b;
    residuals[t] = y[t]! - fitted;
  }
}

function crossChunk(x: ArrayLike<number>, y: ArrayLike<number>, from: number, to: number, sums: Float64Array): void {
  let sx = sums[0]!;
  let sxx = sums[1]!;
  let sy = sums[2]!;
  let sxy = sums[3]!;
  for (let t = from; t < to; t++) {
    const xt = x[t]!;
    const yt = y[t]!;
    sx += xt;
    sxx += xt * xt;
    sy += yt;
    sxy += xt * yt;
  }
  sums[0] = sx;
  sums[1] = sxx;
  sums[2] = sy;
  sums[3] = sxy;
}
