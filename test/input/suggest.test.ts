import { describe, expect, it } from "vitest";
import { closestName, editDistance } from "../../src/input/suggest.js";

describe("editDistance", () => {
  it.each([
    ["", "", 0],
    ["abc", "", 3],
    ["kitten", "sitting", 3],
    ["Low", "Low", 0],
    ["flaw", "lawn", 2],
  ])("between %j and %j is %i", (a, b, d) => {
    expect(editDistance(a, b)).toBe(d);
    expect(editDistance(b, a)).toBe(d);
  });
});

describe("closestName", () => {
  const names = ["Date", "Stillwater Low Vol", "Kestrel High Beta", "T-Bill"];

  it("ignores case and surrounding spaces", () => {
    expect(closestName(" kestrel high beta ", names)).toBe("Kestrel High Beta");
  });

  it("finds small misspellings", () => {
    expect(closestName("Stilwater Low Vol", names)).toBe("Stillwater Low Vol");
    expect(closestName("TBill", names)).toBe("T-Bill");
  });

  it("suggests nothing for an unrelated name", () => {
    expect(closestName("Benchmark", names)).toBeUndefined();
  });
});
