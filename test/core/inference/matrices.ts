/** Matrix comparison for reference values printed to a given number of digits. Not a test file. */

import { expect } from "vitest";
import { expectClose } from "../../support/close.js";

/**
 * Each entry within max(rel |expected|, half a unit of its last printed digit): a value printed as
 * "-0.5617817" cannot be checked beyond +-5e-8, whatever the requested relative tolerance.
 */
export function expectMatrixClose(actual: readonly (readonly number[])[], printed: readonly (readonly string[])[], rel: number): void {
  expect(actual.length).toBe(printed.length);
  printed.forEach((row, i) =>
    row.forEach((text, j) => {
      const expected = Number(text);
      const mantissa = text.toLowerCase().split("e");
      const decimals = (mantissa[0]!.split(".")[1] ?? "").length - Number(mantissa[1] ?? 0);
      const halfUnit = 0.5 * 10 ** -decimals;
      expectClose(actual[i]![j], expected, { rel, abs: Math.max(0, halfUnit - rel * Math.abs(expected)) });
    }),
  );
}
