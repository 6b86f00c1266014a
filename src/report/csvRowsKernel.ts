/**
 * roll's CSV rows through csvRowsKernel.wat: the numbers of a block of windows written as bytes in
 * WebAssembly, each the very text String(x) gives (as writeNumber writes it in JavaScript,
 * numberBytes.ts), from 1e-6 to 2^53 by Ryu (Adams 2018, "Ryu: fast float-to-string conversion",
 * PLDI; docs/methods.md §32). A million windows have 30 million numbers; formatting them was most of
 * such a run in JavaScript (about 95 ns a number; the kernel takes about 50). The row's prefix and
 * head (its dates and observations) are written here into the kernel's memory; a number the kernel
 * leaves (an exponent in its text, 2^53 and beyond, an infinity) is handed back and written here by
 * writeNumber. Null where WebAssembly is missing: the caller then writes the rows in JavaScript
 * (rollCsv.ts formatPackedBlock, the same bytes).
 */
import { kernelInstance } from "../core/numerics/seriesKernel.js";
import { csvRowsKernelWasm } from "./csvRowsKernelWasm.js";
import { maxNumberBytes, writeNumber } from "./numberBytes.js";

/** Where the kernel reads the digit pairs and Ryu's multipliers (csvRowsKernel.wat). */
const PAIRS_AT = 512;
const MULTIPLIERS_AT = 1024;
/** Multipliers 5^i for i = 0 .. 79: enough for every x from 1e-6 to 2^53 (i <= 74). */
const MULTIPLIERS = 80;
/** The rows' prefix starts here; every other area follows it, laid out per block. */
const PREFIX_AT = MULTIPLIERS_AT + 16 * MULTIPLIERS;
const PAGE = 65_536;

/** One block's rows: what the kernel reads and where it writes. */
export interface CsvRowsBlock {
  /** Windows in the block. */
  readonly count: number;
  /** Series per row (each a field after a comma). */
  readonly columns: number;
  /** The series' numbers, column by column (`count` each). */
  readonly numbers: Float64Array;
  /** The bytes before every row (its source and columns). */
  readonly prefix: Uint8Array;
  /** Most bytes a row's head takes. */
  readonly headBytes: number;
  /** Writes row k's head at `at` of `out` and returns its end. */
  readonly writeHead: (k: number, out: Uint8Array, at: number) => number;
}

interface Kernel {
  readonly memory: WebAssembly.Memory;
  readonly rows: (...args: number[]) => number;
}

let kernel: Kernel | null | undefined;

function csvRowsKernel(): Kernel | null {
  if (kernel !== undefined) return kernel;
  kernel = kernelInstance(csvRowsKernelWasm, (exports, memory) => {
    new BigUint64Array(memory.buffer, MULTIPLIERS_AT, 2 * MULTIPLIERS).set(ryuMultipliers(MULTIPLIERS));
    const pairs = new Uint8Array(memory.buffer, PAIRS_AT, 200);
    for (let v = 0; v < 100; v++) [pairs[2 * v], pairs[2 * v + 1]] = [48 + Math.floor(v / 10), 48 + (v % 10)];
    return { memory, rows: exports.rows as (...args: number[]) => number };
  });
  return kernel;
}

const align8 = (n: number): number => (n + 7) & ~7;

/**
 * Ryu's table DOUBLE_POW5_SPLIT (Adams 2018): 5^i scaled by a power of two to 125 bits (its top 125
 * bits, or 5^i shifted left), as 64-bit halves (low, high) for i = 0 .. count - 1.
 */
export function ryuMultipliers(count: number): BigUint64Array {
  const table = new BigUint64Array(2 * count);
  for (let i = 0; i < count; i++) {
    const power = 5n ** BigInt(i);
    const bits = power.toString(2).length;
    const scaled = bits >= 125 ? power >> BigInt(bits - 125) : power << BigInt(125 - bits);
    table[2 * i] = scaled & 0xffff_ffff_ffff_ffffn;
    table[2 * i + 1] = scaled >> 64n;
  }
  return table;
}

/** What writeCsvRows wrote: the bytes, and how many numbers the kernel handed back to String(x). */
export interface CsvRowsWritten {
  readonly length: number;
  readonly handedBack: number;
}

/**
 * Writes the block's rows (each: prefix, head, a comma and a field per series, a line feed) into `out`,
 * or returns null without a kernel (nothing written).
 */
export function writeCsvRows(block: CsvRowsBlock, out: Uint8Array): CsvRowsWritten | null {
  const found = csvRowsKernel();
  if (found === null) return null;
  const { count, columns, numbers, prefix, headBytes, writeHead } = block;
  const stride = align8(4 + headBytes);
  const headsAt = align8(PREFIX_AT + prefix.length);
  const numbersAt = headsAt + count * stride;
  const outAt = numbersAt + count * columns * 8;
  const rowBytes = prefix.length + headBytes + columns * (maxNumberBytes + 1) + 1;
  const need = outAt + count * rowBytes;
  const { memory } = found;
  if (need > memory.buffer.byteLength) memory.grow(Math.ceil((need - memory.buffer.byteLength) / PAGE));
  const bytes = new Uint8Array(memory.buffer);
  const words = new Int32Array(memory.buffer);
  bytes.set(prefix, PREFIX_AT);
  for (let k = 0; k < count; k++) {
    const at = headsAt + k * stride;
    words[at >> 2] = writeHead(k, bytes, at + 4) - (at + 4);
  }
  const series = new Float64Array(memory.buffer, numbersAt, count * columns);
  series.set(numbers.subarray(0, count * columns));
  let [k, c, at, handedBack] = [0, -1, outAt, 0];
  while (found.rows(count, columns, k, c, at, PREFIX_AT, prefix.length, headsAt, stride, numbersAt) === 1) {
    handedBack += 1;
    // A number the kernel hands back: String(x) at its place, then on from the next column.
    [k, c] = [words[0]!, words[1]!];
    at = writeNumber(series[c * count + k]!, bytes, words[2]!);
    c += 1;
  }
  const end = words[3]!;
  out.set(bytes.subarray(outAt, end));
  return { length: end - outAt, handedBack };
}
