/**
 * The one-factor fit's passes in the WebAssembly matrix kernel (src/core/numerics/matrixKernel.ts)
 * against their JavaScript twins, bit for bit (`Object.is` on every number): the Jacobi sweeps of
 * symmetricEigen on random, degenerate and non-finite symmetric matrices, choleskyLogDetInverse on
 * positive definite and singular ones, solveOrNull (from 6 rows) with pivoting, and the whole fit
 * (fitOneFactor: scaled matrices, power iterations, Jacobi restarts) on sample covariances of strong,
 * weak and Heywood factor structures. The results themselves are checked elsewhere
 * (test/core/models/factorModel*.test.ts, against R's factanal).
 */
import { describe, expect, it } from "vitest";
import { fitOneFactor } from "../../../src/core/models/factorModelFit.js";
import { sampleCovariance } from "../../../src/core/models/factorModel.js";
import { eliminationKernel, MATRIX_KERNEL_SIZE, matrixKernel } from "../../../src/core/numerics/matrixKernel.js";
import { solveOrNull } from "../../../src/core/numerics/linearAlgebra.js";
import { createRandom } from "../../../src/core/numerics/rng.js";
import { choleskyLogDetInverse, symmetricEigen } from "../../../src/core/numerics/symmetricEigen.js";
import { expectSameBits } from "../../support/kernelTwins.js";

function symmetric(n: number, seed: number, scale = 1): number[][] {
  const random = createRandom(seed);
  const m = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) m[i]![j] = m[j]![i] = scale * random.normal();
  return m;
}

describe("the matrix and elimination kernels", () => {
  it("are available on Node 20 (else the fit would silently take the JavaScript path)", () => {
    expect(matrixKernel()).not.toBeNull();
    expect(eliminationKernel()).not.toBeNull();
  });
});

describe("symmetricEigen in the matrix kernel", () => {
  it("gives the JavaScript sweeps' values and vectors bit for bit", () => {
    for (const [seed, n] of [
      [1, 1],
      [2, 2],
      [3, 3],
      [4, 10],
      [5, 17],
      [6, 40],
      [7, MATRIX_KERNEL_SIZE],
    ] as const) {
      const m = symmetric(n, seed, seed % 2 === 0 ? 1e-5 : 3);
      expectSameBits(symmetricEigen(m), symmetricEigen(m, false), `n ${n}`);
    }
  });

  it("gives the same bits on diagonal, repeated, zero and non-finite matrices, and beyond its size", () => {
    const cases = [
      [
        [2, 0, 0],
        [0, 1, 0],
        [0, 0, 3],
      ],
      [
        [1, 1, 1],
        [1, 1, 1],
        [1, 1, 1],
      ],
      [
        [0, 0],
        [0, 0],
      ],
      // A zero off-diagonal entry between equal diagonal entries: no rotation (0 / 0 would be NaN).
      [
        [1, 0, 1],
        [0, 1, 0],
        [1, 0, 1],
      ],
      [
        [1, Number.NaN],
        [Number.NaN, 2],
      ],
      [
        [1, -0],
        [-0, Number.POSITIVE_INFINITY],
      ],
      symmetric(MATRIX_KERNEL_SIZE + 1, 9),
    ];
    for (const [i, m] of cases.entries()) expectSameBits(symmetricEigen(m), symmetricEigen(m, false), `case ${i}`);
  });
});

describe("choleskyLogDetInverse in the matrix kernel", () => {
  it("gives the JavaScript factor's log det and inverse bit for bit, and null where it does", () => {
    for (const [seed, n] of [
      [11, 1],
      [12, 3],
      [13, 10],
      [14, 33],
      [15, MATRIX_KERNEL_SIZE],
    ] as const) {
      // A positive definite matrix B B' + I / 10, and one made singular by a repeated row and column.
      const b = symmetric(n, seed);
      const spd = b.map((row, i) => b.map((other, j) => row.reduce((sum, x, k) => sum + x * other[k]!, 0) + (i === j ? 0.1 : 0)));
      expectSameBits(choleskyLogDetInverse(spd), choleskyLogDetInverse(spd, false), `n ${n}`);
      if (n > 1) {
        const singular = spd.map((row) => [...row.slice(0, n - 1), row[0]!]);
        singular[n - 1] = [...singular[0]!];
        expect(choleskyLogDetInverse(singular)).toBeNull();
        expect(choleskyLogDetInverse(singular, false)).toBeNull();
      }
    }
    expectSameBits(choleskyLogDetInverse([[Number.NaN]]), choleskyLogDetInverse([[Number.NaN]], false), "NaN");
    // Pivots just below and just above 1e-12 of their diagonal entry: singular, then positive definite.
    for (const pivot of [5e-13, 2e-12]) {
      const x = Math.sqrt(1 - pivot);
      const near = [
        [1, x],
        [x, 1],
      ];
      expect(choleskyLogDetInverse(near) === null, `pivot ${pivot}`).toBe(pivot < 1e-12);
      expectSameBits(choleskyLogDetInverse(near), choleskyLogDetInverse(near, false), `pivot ${pivot}`);
    }
  });
});

describe("solveOrNull in the matrix kernel", () => {
  it("gives the JavaScript elimination's solution bit for bit, pivoting, and null where it does", () => {
    for (const [seed, n, m] of [
      [21, 6, 1],
      [22, 7, 7],
      [23, 20, 20],
      [24, 33, 5],
      [25, MATRIX_KERNEL_SIZE, MATRIX_KERNEL_SIZE],
    ] as const) {
      const random = createRandom(seed);
      // Entries of very different sizes, so that rows are swapped.
      const a = Array.from({ length: n }, () =>
        Array.from({ length: n }, () => random.normal() * 10 ** Math.floor(random.uniform() * 6 - 3)),
      );
      const b = Array.from({ length: n }, () => Array.from({ length: m }, () => random.normal()));
      expectSameBits(solveOrNull(a, b, 1e-12), solveOrNull(a, b, 1e-12, false), `n ${n}, m ${m}`);
      // A zero in a factor's place (no elimination on that row) and a singular system.
      const sparse = a.map((row, i) => row.map((x, j) => (i > j && (i + j) % 3 === 0 ? 0 : x)));
      expectSameBits(solveOrNull(sparse, b, 0), solveOrNull(sparse, b, 0, false), `sparse n ${n}`);
      const singular = a.map((row) => [...row]);
      singular[n - 1] = [...singular[0]!];
      expect(solveOrNull(singular, b, 1e-12)).toBeNull();
      expect(solveOrNull(singular, b, 1e-12, false)).toBeNull();
      // Numerically singular: a row that differs from another by 1e-13 in one entry, null at a tolerance
      // of 1e-12 and solved at 0 (only an exact zero pivot fails).
      const near = a.map((row, i) => row.map((x, j) => (i === j ? 1 + i : 0.01 * Math.tanh(x))));
      near[n - 1] = near[0]!.map((x, j) => x + (j === n - 1 ? 1e-13 : 0));
      for (const tolerance of [1e-12, 0]) {
        expect(solveOrNull(near, b, tolerance) === null, `tolerance ${tolerance}`).toBe(tolerance > 0);
        expectSameBits(solveOrNull(near, b, tolerance), solveOrNull(near, b, tolerance, false), `near n ${n}`);
      }
    }
  });
});

describe("fitOneFactor in the matrix kernel", () => {
  /** The sample covariance of k portfolios on one factor with loadings `b` and noise variances `psi`. */
  function covariance(b: readonly number[], psi: readonly number[], n: number, seed: number): number[][] {
    const random = createRandom(seed);
    const factor = Float64Array.from({ length: n }, () => 0.01 * random.normal());
    const series = b.map((beta, i) => Float64Array.from(factor, (f) => beta * f + Math.sqrt(psi[i]!) * random.normal()));
    return sampleCovariance(series);
  }

  it("gives the JavaScript fit bit for bit: strong, weak and Heywood structures, k from 3 to 20", () => {
    const structures: [string, number[], number[]][] = [
      ["strong, k = 10", [0.5, 0.6, 0.7, 0.8, 0.9, 1, 1.1, 1.2, 1.3, 1.4], new Array(10).fill(1e-5)],
      ["weak, k = 5", [0.05, 0.04, 0.06, 0.05, 0.03], new Array(5).fill(1e-4)],
      ["a Heywood case, k = 4", [1, 0.2, 0.3, 0.25], [1e-12, 1e-4, 1e-4, 1e-4]],
      ["k = 3", [0.8, 1, 1.2], [2e-5, 3e-5, 1e-5]],
      ["k = 20", Array.from({ length: 20 }, (_, i) => 0.4 + 0.06 * i), Array.from({ length: 20 }, (_, i) => 1e-5 * (1 + (i % 4)))],
    ];
    for (const [i, [label, b, psi]] of structures.entries()) {
      const s = covariance(b, psi, 2_000 + 500 * i, 40 + i);
      const inKernel = fitOneFactor(s, 2_000, true);
      const inJs = fitOneFactor(s, 2_000, false);
      expect(inKernel, label).not.toBeNull();
      expectSameBits(inKernel, inJs, label);
    }
  });
});
