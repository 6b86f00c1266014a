import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { compileSentinels, isMissingToken, parseDecimal } from "../../src/input/values/numbers.js";

describe("parseDecimal", () => {
  it.each([
    ["0.01", 0.01],
    ["-0.5", -0.5],
    ["+2", 2],
    ["1e-3", 0.001],
    ["1.5E+2", 150],
    [" 0.25 ", 0.25],
    ["\t3\t", 3],
    [".5", 0.5],
    ["5.", 5],
    ["007", 7],
  ])("accepts plain decimal notation %j", (text, expected) => {
    expect(parseDecimal(text)).toBe(expected);
  });

  it("keeps the sign of negative zero", () => {
    expect(Object.is(parseDecimal("-0"), -0)).toBe(true);
  });

  it.each([
    "",
    " ",
    "1.2abc",
    "0x10",
    "Infinity",
    "-Infinity",
    "NaN",
    "1,5",
    "--1",
    "+-1",
    "1e",
    "e5",
    ".",
    "1..2",
    "1e999",
    "1 000",
    "１",
  ])("rejects %j", (text) => {
    expect(parseDecimal(text)).toBeNull();
  });

  it("agrees with Number on every accepted text and round-trips String(x)", () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => {
        expect(Object.is(parseDecimal(String(x)), x) || (Object.is(x, -0) && parseDecimal(String(x)) === 0)).toBe(true);
      }),
    );
  });

  it("never accepts text that Number would read differently", () => {
    fc.assert(
      fc.property(fc.string(), (text) => {
        const value = parseDecimal(text);
        if (value !== null) expect(value).toBe(Number(text));
      }),
    );
  });
});

describe("missing values", () => {
  it.each(["", "  ", "NA", "na", "NaN", "null", "NULL", "N/A", "n/a", " N/A "])("treats %j as missing", (text) => {
    expect(isMissingToken(text)).toBe(true);
  });

  it.each(["0", "-", "none", "#N/A", "-99.99"])("does not treat %j as missing by itself", (text) => {
    expect(isMissingToken(text)).toBe(false);
  });

  it("splits sentinels into numeric values and texts", () => {
    const sentinels = compileSentinels(["-99.99", "#N/A", " Missing "]);
    expect([...sentinels.numbers]).toEqual([-99.99]);
    expect([...sentinels.texts]).toEqual(["#n/a", "missing"]);
  });
});
