/**
 * roll's CSV rows written by the WebAssembly kernel (src/report/csvRowsKernel.ts) against the
 * reference outside the project, ECMAScript's String(x) (V8's Number::toString), and against the
 * JavaScript rows (formatPackedBlock with useKernel false), byte for byte: numbers of every magnitude,
 * the kernel's edges (1e-6, 2^53, powers of two, short decimals, integers), non-finite values and
 * zeros, a million random doubles, blocks of several sizes and a prefix long enough to grow the
 * kernel's memory. Ryu's multipliers are checked against the table's definition in BigInt.
 */
import { describe, expect, it } from "vitest";
import { windowColumnNames } from "../../src/core/rolling/index.js";
import { createRandom } from "../../src/core/numerics/rng.js";
import { PLAIN_DATE_FORM, stampIso } from "../../src/input/values/dateStamps.js";
import { ryuMultipliers, writeCsvRows } from "../../src/report/csvRowsKernel.js";
import { formatPackedBlock, type PackedBlock, stampRowBytes } from "../../src/report/rollCsv.js";

const columns = windowColumnNames.length;
const day = 86_400_000;

/** Numbers a window's series could hold, and the ones the fast path must hand back. */
function hostile(random: ReturnType<typeof createRandom>): number {
  const pick = Math.floor(random.uniform() * 12);
  const sign = random.uniform() < 0.3 ? -1 : 1;
  switch (pick) {
    case 0:
      return sign * random.uniform() * 10 ** Math.floor(random.uniform() * 40 - 20);
    case 1:
      return sign * 2 ** Math.floor(random.uniform() * 120 - 60);
    case 2:
      return (sign * Math.round(random.uniform() * 1e6)) / 10 ** Math.floor(random.uniform() * 8);
    case 3:
      return [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, 0, -0, 5e-324, 1.7976931348623157e308][
        Math.floor(random.uniform() * 7)
      ]!;
    case 4:
      return sign * (1e-6 + (random.uniform() - 0.5) * 1e-20);
    case 5:
      return sign * (1e16 + Math.floor((random.uniform() - 0.5) * 64));
    case 6:
      return sign * (1e17 - Math.floor(random.uniform() * 64) * 16);
    case 7:
      return sign * Math.floor(random.uniform() * 2 ** 33);
    case 8:
      return sign * (0.5 + Math.floor(random.uniform() * 100) / 4);
    default:
      return sign * (1e-4 + 0.01 * random.normal());
  }
}

function block(count: number, seed: number): PackedBlock {
  const random = createRandom(seed);
  const keys = new Float64Array(2 * count);
  const numbers = new Float64Array((1 + columns) * count);
  for (let k = 0; k < count; k++) {
    keys[2 * k] = Date.UTC(2001, 0, 1) + k * day;
    keys[2 * k + 1] = Date.UTC(2001, 0, 1) + (k + 251) * day;
    numbers[k] = k % 17 === 0 ? Number.NaN : 252;
  }
  for (let i = count; i < numbers.length; i++) numbers[i] = hostile(random);
  return { count, keys, numbers };
}

/** The rows as String(x) writes them (an empty field for NaN). */
function reference(packed: PackedBlock, prefix: string): string {
  const { count, keys, numbers } = packed;
  let text = "";
  for (let k = 0; k < count; k++) {
    const observations = numbers[k]!;
    text += `${prefix}${stampIso(keys[2 * k]!, PLAIN_DATE_FORM)},${stampIso(keys[2 * k + 1]!, PLAIN_DATE_FORM)},${Number.isNaN(observations) ? "" : observations}`;
    for (let c = 0; c < columns; c++) {
      const x = numbers[(c + 1) * count + k]!;
      text += `,${Number.isNaN(x) ? "" : String(x)}`;
    }
    text += "\n";
  }
  return text;
}

function rows(packed: PackedBlock, prefix: Uint8Array, useKernel: boolean): string {
  const out = new Uint8Array(packed.count * stampRowBytes(prefix.length, columns));
  return Buffer.from(out.subarray(0, formatPackedBlock(packed, prefix, PLAIN_DATE_FORM, out, useKernel))).toString("latin1");
}

describe("roll's CSV rows in the kernel", () => {
  it("use Ryu's multipliers: 5^i to 125 bits, its top bits or shifted left (as Ryu's table generator makes them)", () => {
    const table = ryuMultipliers(80);
    for (const i of [0, 1, 2, 27, 53, 54, 55, 74, 79]) {
      const value = table[2 * i + 1]! * 2n ** 64n + table[2 * i]!;
      expect(value.toString(2)).toHaveLength(125);
      const power = 5n ** BigInt(i);
      const shift = power.toString(2).length - 125;
      // Scaled back, the multiplier is 5^i itself (i <= 53: 5^i fits in 125 bits) or its floor.
      if (shift <= 0) expect(value).toBe(power << BigInt(-shift));
      else expect(value <= power >> BigInt(shift) && power - (value << BigInt(shift)) < 1n << BigInt(shift)).toBe(true);
    }
  });

  it("are String(x) for numbers of every magnitude and the fast path's edges, as the JavaScript rows are", () => {
    const prefix = "returns.csv,low,high,";
    const bytes = Buffer.from(prefix);
    for (const [seed, count] of [
      [1, 1],
      [2, 7],
      [3, 333],
      [4, 4096],
    ] as const) {
      const packed = block(count, seed);
      const expected = reference(packed, prefix);
      expect(rows(packed, bytes, true)).toBe(expected);
      expect(rows(packed, bytes, false)).toBe(expected);
    }
  });

  it("are String(x) for a million random doubles of the fast path's range (every bit pattern's digits)", () => {
    const random = createRandom(77);
    const packed = block(1000, 5);
    const words = new Uint32Array(packed.numbers.buffer);
    for (let round = 0; round < 33; round++) {
      // Random mantissas and exponents from 1e-7 to 1e18, either sign.
      for (let i = 2 * packed.count; i < words.length; i += 2) {
        words[i] = Math.floor(random.uniform() * 2 ** 32);
        words[i + 1] =
          ((random.uniform() < 0.5 ? 0 : 0x80000000) |
            ((999 + Math.floor(random.uniform() * 85)) << 20) |
            Math.floor(random.uniform() * 2 ** 20)) >>>
          0;
      }
      expect(rows(packed, Buffer.from("p,"), true)).toBe(reference(packed, "p,"));
    }
  });

  it("grows its memory for a long prefix and a larger block, and reuses it for a smaller one", () => {
    const long = `${"x".repeat(70_000)},low,high,`;
    for (const [seed, count] of [
      [6, 50],
      [7, 300],
      [8, 3],
    ] as const) {
      const packed = block(count, seed);
      expect(rows(packed, Buffer.from(long), true)).toBe(reference(packed, long));
    }
  });

  it("writes nothing into the caller's buffer beyond what it returns", () => {
    const packed = block(20, 9);
    const prefix = Buffer.from("a,b,c,");
    const out = new Uint8Array(20 * stampRowBytes(prefix.length, columns)).fill(7);
    const head = (k: number, bytes: Uint8Array, at: number) => {
      bytes.set(Buffer.from(`h${k}`), at);
      return at + `h${k}`.length;
    };
    const length = writeCsvRows({ count: 20, columns, numbers: packed.numbers.subarray(20), prefix, headBytes: 8, writeHead: head }, out);
    expect(length).not.toBeNull();
    const end = length?.length ?? 0;
    expect(out.subarray(end).every((b) => b === 7)).toBe(true);
    expect(Buffer.from(out.subarray(0, end)).toString("latin1").split("\n")[3]?.startsWith("a,b,c,h3,")).toBe(true);
  });

  it("settles in the kernel every number from 1e-6 to 2^53 and hands back only the others", () => {
    const random = createRandom(31);
    const count = 1000;
    const numbers = new Float64Array(count * columns);
    // Columns 0..20: numbers of any length in each decade from 1e-6 to 1e15, powers of two and short
    // decimals among them; 21..29: ones outside, which String(x) writes (exponents, and beyond 2^53).
    for (let k = 0; k < count; k++) {
      for (let c = 0; c < 21; c++) {
        const digits = 1 + (k % 17);
        const x = (1 + random.uniform() * 9) * 10 ** (c - 6);
        numbers[c * count + k] = c % 5 === 4 ? 2 ** Math.floor(Math.log2(x)) : Number(x.toPrecision(digits));
      }
      const outside = [1e-7 * (1 + random.uniform()), 2 ** 53 * (1 + random.uniform()), Number.POSITIVE_INFINITY, -1e300];
      for (let c = 21; c < columns; c++) numbers[c * count + k] = outside[c % 4]!;
    }
    const prefix = Buffer.from("p,");
    const out = new Uint8Array(count * stampRowBytes(prefix.length, columns));
    const written = writeCsvRows({ count, columns, numbers, prefix, headBytes: 0, writeHead: (_, __, at) => at }, out);
    expect(written?.handedBack).toBe(9 * count);
    const lines = Buffer.from(out.subarray(0, written?.length ?? 0))
      .toString("latin1")
      .split("\n");
    for (let k = 0; k < count; k += 97)
      expect(lines[k]).toBe(`p,${Array.from({ length: columns }, (_, c) => `,${String(numbers[c * count + k])}`).join("")}`);
  });
});
