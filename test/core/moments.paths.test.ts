import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { crossProducts } from "../../src/core/moments.js";

describe("crossProducts", () => {
  it("gives the same bits from the unrolled three-series path (Float64Array) and the general path", () => {
    const finite = fc.double({ min: -1e3, max: 1e3, noNaN: true, noDefaultInfinity: true });
    fc.assert(
      fc.property(fc.array(fc.tuple(finite, finite, finite), { minLength: 1, maxLength: 60 }), (rows) => {
        const columns = [0, 1, 2].map((i) => rows.map((r) => r[i]!));
        const unrolled = crossProducts(columns.map((c) => Float64Array.from(c)));
        const general = crossProducts(columns); // plain arrays take the general loop
        expect(unrolled).toEqual(general); // toEqual compares numbers with Object.is: bit for bit
      }),
      { seed: 20261202, numRuns: 300 },
    );
  });
});
