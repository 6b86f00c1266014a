/**
 * The radix-2 transform (src/core/numerics/fft.ts) against numpy.fft (test/fixtures/inference/spectral.json,
 * generate_spectral.py) and against the definition X_k = sum_m x_m e^{-+2 pi i k m / N} written out here.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { fft, twiddles } from "../../../src/core/numerics/fft.js";
import { fixtureText } from "../inference/fixtures.js";

/** The definition, O(N^2), each term from its own angle. */
function dft(re: number[], im: number[], inverse: boolean): { re: number[]; im: number[] } {
  const n = re.length;
  const sign = inverse ? 1 : -1;
  const out = { re: new Array<number>(n).fill(0), im: new Array<number>(n).fill(0) };
  for (let k = 0; k < n; k++) {
    for (let m = 0; m < n; m++) {
      const angle = (sign * 2 * Math.PI * ((k * m) % n)) / n;
      out.re[k] = out.re[k]! + re[m]! * Math.cos(angle) - im[m]! * Math.sin(angle);
      out.im[k] = out.im[k]! + re[m]! * Math.sin(angle) + im[m]! * Math.cos(angle);
    }
  }
  return out;
}

function transformed(re: number[], im: number[], inverse: boolean): { re: Float64Array; im: Float64Array } {
  const r = Float64Array.from(re);
  const i = Float64Array.from(im);
  fft(r, i, twiddles(re.length), inverse);
  return { re: r, im: i };
}

const norm = (xs: ArrayLike<number>, ys: ArrayLike<number>): number => {
  let total = 0;
  for (let k = 0; k < xs.length; k++) total += xs[k]! ** 2 + ys[k]! ** 2;
  return Math.sqrt(total);
};

const largestGap = (a: ArrayLike<number>, b: ArrayLike<number>): number => {
  let gap = 0;
  for (let k = 0; k < a.length; k++) gap = Math.max(gap, Math.abs(a[k]! - b[k]!));
  return gap;
};

describe("the radix-2 Fourier transform", () => {
  const fixture = JSON.parse(fixtureText("spectral.json")).fft as Record<
    "re" | "im" | "forwardRe" | "forwardIm" | "inverseRe" | "inverseIm",
    number[]
  >;

  it("gives numpy.fft.fft and N times numpy.fft.ifft of 64 points to 1e-14 of the transform's norm", () => {
    const forward = transformed(fixture.re, fixture.im, false);
    const scale = norm(fixture.forwardRe, fixture.forwardIm);
    expect(largestGap(forward.re, fixture.forwardRe)).toBeLessThan(1e-14 * scale);
    expect(largestGap(forward.im, fixture.forwardIm)).toBeLessThan(1e-14 * scale);
    const inverse = transformed(fixture.re, fixture.im, true);
    expect(largestGap(inverse.re, fixture.inverseRe)).toBeLessThan(1e-14 * scale);
    expect(largestGap(inverse.im, fixture.inverseIm)).toBeLessThan(1e-14 * scale);
  });

  it("is the definition at every length from 1 to 256, forward and inverse", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 8 }), fc.boolean(), fc.integer({ min: 1, max: 1e6 }), (power, inverse, seed) => {
        const n = 2 ** power;
        const values = Array.from({ length: 2 * n }, (_, k) => Math.sin(seed * 0.001 + k * 1.7) * (1 + (k % 5)));
        const re = values.slice(0, n);
        const im = values.slice(n);
        const expected = dft(re, im, inverse);
        const got = transformed(re, im, inverse);
        const scale = Math.max(norm(expected.re, expected.im), 1);
        expect(largestGap(got.re, expected.re)).toBeLessThan(1e-13 * scale);
        expect(largestGap(got.im, expected.im)).toBeLessThan(1e-13 * scale);
      }),
      { numRuns: 60, seed: 20261205 },
    );
  });

  it("comes back to N times the sequence through the inverse, at 2^16 points", () => {
    const n = 1 << 16;
    const re = Array.from({ length: n }, (_, k) => Math.cos(k * 0.37) + (k % 7) - 3);
    const im = Array.from({ length: n }, (_, k) => Math.sin(k * 1.3));
    const there = transformed(re, im, false);
    const table = twiddles(n);
    fft(there.re, there.im, table, true);
    const back = { re: Array.from(there.re, (v) => v / n), im: Array.from(there.im, (v) => v / n) };
    expect(largestGap(back.re, re)).toBeLessThan(1e-13);
    expect(largestGap(back.im, im)).toBeLessThan(1e-13);
  });

  it("takes lengths that are powers of two only, and arrays at least that long", () => {
    expect(() => twiddles(12)).toThrow(RangeError);
    expect(() => twiddles(0)).toThrow(RangeError);
    expect(() => fft(new Float64Array(4), new Float64Array(2), twiddles(4), false)).toThrow(RangeError);
    const one = transformed([2.5], [-1], false);
    expect([one.re[0], one.im[0]]).toEqual([2.5, -1]);
  });
});
