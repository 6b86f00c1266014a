/**
 * `roll --format csv`: a row per window, written as bytes into one reused buffer and handed to the
 * output a megabyte at a time. No line is built as a string: numbers go in by `writeNumber` (the text
 * String(x) gives), dates and names by their UTF-8 bytes, so a million windows cost the columns and
 * one buffer.
 */

import type { WindowUncertainty } from "../core/inference/windowUncertainty.js";
import { windowColumnNames, type WindowColumns } from "../core/rolling/index.js";
import { csvText } from "./csv.js";
import { MAX_STAMP_ISO_BYTES, writeStampIso } from "../input/index.js";
import { writeCsvRows } from "./csvRowsKernel.js";
import { maxNumberBytes, writeNumber } from "./numberBytes.js";
import type { RollMeta } from "./rollReport.js";

export const uncertaintyColumnNames = [
  "lowBetaMinStdError",
  "lowBetaMaxStdError",
  "highBetaMinStdError",
  "highBetaMaxStdError",
  "lowBetaIntervalLower",
  "lowBetaIntervalUpper",
  "returnImpliedStdError",
  "returnImpliedLower",
  "returnImpliedUpper",
  "pricingPValue",
  "pricingVerdict",
] as const;

export function rollCsvHeader(withUncertainty: boolean): string {
  const names = [
    "source",
    "lowColumn",
    "highColumn",
    "start",
    "end",
    "observations",
    ...windowColumnNames,
    ...(withUncertainty ? uncertaintyColumnNames : []),
  ];
  return `${names.join(",")}\n`;
}

/** The bytes handed to the output at a time (the buffer grows only for a row longer than this). */
const chunkBytes = 1 << 20;

const encoder = new TextEncoder();

/**
 * Bytes gathered into one buffer and handed to `write` when it fills. `write` must be done with the
 * bytes when its promise resolves (the output path writes or copies them): the buffer is then reused.
 */
class ByteChunks {
  private buffer = new Uint8Array(chunkBytes);
  position = 0;

  constructor(private readonly write: (bytes: Uint8Array) => Promise<void>) {}

  /** Whether `bytes` more fit without handing over what is gathered. */
  fits(bytes: number): boolean {
    return this.position + bytes <= this.buffer.length;
  }

  /** Room for `bytes` more: what is gathered is handed over (and the buffer grown if need be). */
  async makeRoom(bytes: number): Promise<void> {
    await this.flush();
    if (bytes > this.buffer.length) this.buffer = new Uint8Array(bytes);
  }

  async flush(): Promise<void> {
    if (this.position === 0) return;
    await this.write(this.buffer.subarray(0, this.position));
    this.position = 0;
  }

  byte(b: number): void {
    this.buffer[this.position++] = b;
  }

  bytes(b: Uint8Array): void {
    this.buffer.set(b, this.position);
    this.position += b.length;
  }

  /** A field for each column's window k after a comma: String(x), or nothing for NaN. */
  fields(series: readonly Float64Array[], k: number): void {
    this.position = writeFields(this.buffer, this.position, series, k);
  }

  /** A field: String(x), or nothing for NaN (an undefined quantity). */
  number(x: number): void {
    if (!Number.isNaN(x)) this.position = writeNumber(x, this.buffer, this.position);
  }

  /** A row of stamps without its line feed: see writeStampRow. */
  stampRow(
    prefix: Uint8Array,
    form: number,
    first: number,
    last: number,
    observations: number,
    series: readonly Float64Array[],
    k: number,
  ): void {
    this.position = writeStampRow(this.buffer, this.position, prefix, form, first, last, observations, series, k);
  }

  /** A string's UTF-8 bytes (at most 3 a UTF-16 unit, room for which was reserved). */
  text(s: string): void {
    const out = this.buffer;
    let at = this.position;
    for (let k = 0; k < s.length; k++) {
      const c = s.charCodeAt(k);
      if (c >= 0x80) {
        at = this.position + encoder.encodeInto(s, out.subarray(this.position)).written;
        break;
      }
      out[at++] = c;
    }
    this.position = at;
  }
}

const comma = 44;
const newline = 10;

/**
 * CSV rows of every window, from the columns a block at a time (`blocks`: rollSolveColumnBlocks' or
 * one whole WindowColumns), handed to `write` about a megabyte at a time (awaited: the writer may
 * hold back a fast producer; it must be done with the bytes when its promise resolves, as the buffer
 * is reused); an empty field where a quantity is undefined (no set, no CAPM fit). With
 * `uncertainty`, its columns follow, asked for window by window in order.
 */
export async function writeRollCsv(
  meta: RollMeta,
  blocks: Iterable<WindowColumns>,
  uncertainty: (() => WindowUncertainty | null) | null,
  write: (bytes: Uint8Array) => Promise<void>,
): Promise<void> {
  const prefix = rollCsvPrefix(meta);
  const { stamps } = meta;
  const numbersPerRow = 1 + windowColumnNames.length + (uncertainty === null ? 0 : uncertaintyColumnNames.length);
  const rowBytesButDates = prefix.length + 32 + numbersPerRow * (maxNumberBytes + 1);
  const out = new ByteChunks(write);
  for (const columns of blocks) {
    const series = windowColumnNames.map((name) => columns.columns[name]);
    const { start, end, observations, count } = columns;
    for (let k = 0; k < count; k++) {
      if (stamps === undefined) {
        const first = meta.dates[start[k]!]!;
        const last = meta.dates[end[k]!]!;
        const room = rowBytesButDates + 3 * (first.length + last.length);
        if (!out.fits(room)) await out.makeRoom(room); // awaited only when a chunk is handed over
        out.bytes(prefix);
        out.text(first);
        out.byte(comma);
        out.text(last);
        out.byte(comma);
        out.number(observations[k]!);
        out.fields(series, k);
      } else {
        const room = rowBytesButDates + 2 * MAX_STAMP_ISO_BYTES;
        if (!out.fits(room)) await out.makeRoom(room);
        out.stampRow(prefix, stamps.form, stamps.keys[start[k]!]!, stamps.keys[end[k]!]!, observations[k]!, series, k);
      }
      if (uncertainty !== null) writeUncertainty(out, uncertainty());
      out.byte(newline);
    }
  }
  await out.flush();
}

/** A window's uncertainty columns (empty fields where it has none). */
function writeUncertainty(out: ByteChunks, u: WindowUncertainty | null): void {
  const p = u?.pricing?.returnImpliedLowBeta;
  const values =
    u === null
      ? [Number.NaN, Number.NaN, Number.NaN, Number.NaN, Number.NaN, Number.NaN]
      : [
          u.bounds.lowBeta.min.stdError,
          u.bounds.lowBeta.max.stdError,
          u.bounds.highBeta.min.stdError,
          u.bounds.highBeta.max.stdError,
          u.lowBeta.interval.lower,
          u.lowBeta.interval.upper,
        ];
  values.push(p?.stdError ?? Number.NaN, p?.lower ?? Number.NaN, p?.upper ?? Number.NaN, u?.pricing?.pValue ?? Number.NaN);
  for (const x of values) {
    out.byte(comma);
    out.number(x);
  }
  out.byte(comma);
  out.text(u?.pricing?.verdict ?? "");
}

/**
 * A CSV row of window k whose dates are stamps of form `form` (first and last: the keys of its first
 * and last date), without its line feed: the prefix (source and columns), the dates, the observations
 * and a field per series (empty for NaN). Returns the end. The one layout of such rows, in this thread
 * and in the CSV's worker thread (cli/runtime/rollCsvThreads.ts).
 */
export function writeStampRow(
  out: Uint8Array,
  at: number,
  prefix: Uint8Array,
  form: number,
  first: number,
  last: number,
  observations: number,
  series: readonly Float64Array[],
  k: number,
): number {
  out.set(prefix, at);
  const i = writeStampHead(out, at + prefix.length, form, first, last, observations);
  return writeFields(out, i, series, k);
}

/** Most bytes writeStampHead writes. */
const stampHeadBytes = 2 * MAX_STAMP_ISO_BYTES + 2 + maxNumberBytes;

/** A row's dates and observations (after its prefix): first,last,observations; returns the end. */
function writeStampHead(out: Uint8Array, at: number, form: number, first: number, last: number, observations: number): number {
  let i = writeStampIso(first, form, out, at);
  out[i++] = comma;
  i = writeStampIso(last, form, out, i);
  out[i++] = comma;
  if (!Number.isNaN(observations)) i = writeNumber(observations, out, i);
  return i;
}

/** A field for each series' window k, each after a comma: String(x), or nothing for NaN; returns the end. */
function writeFields(out: Uint8Array, at: number, series: readonly Float64Array[], k: number): number {
  let i = at;
  for (let c = 0; c < series.length; c++) {
    out[i++] = comma;
    const x = series[c]![k]!;
    if (!Number.isNaN(x)) i = writeNumber(x, out, i);
  }
  return i;
}

/** Most bytes a row of stamps takes with `columns` series after a prefix of `prefixBytes`, line feed included. */
export function stampRowBytes(prefixBytes: number, columns: number): number {
  return prefixBytes + 2 * MAX_STAMP_ISO_BYTES + 2 + (1 + columns) * (maxNumberBytes + 1) + 1;
}

/**
 * A block of windows copied out of its reused arrays, for formatting elsewhere: `keys` holds each
 * window's first and last date keys (2 k, 2 k + 1), `numbers` the observations and then each series
 * (windowColumnNames order), `count` numbers each.
 */
export interface PackedBlock {
  count: number;
  readonly keys: Float64Array;
  readonly numbers: Float64Array;
}

/** Copies the windows of `columns` into `into` (room for as many windows as the blocks hold). */
export function packBlock(columns: WindowColumns, stampKeys: Float64Array, into: PackedBlock): void {
  const { count, start, end, observations } = columns;
  const { keys, numbers } = into;
  into.count = count;
  for (let k = 0; k < count; k++) {
    keys[2 * k] = stampKeys[start[k]!]!;
    keys[2 * k + 1] = stampKeys[end[k]!]!;
    numbers[k] = observations[k]!;
  }
  windowColumnNames.forEach((name, c) => numbers.set(columns.columns[name].subarray(0, count), (c + 1) * count));
}

/**
 * The CSV rows of a packed block into `out` (room for stampRowBytes each); the bytes written. The
 * numbers are written by the WebAssembly kernel (csvRowsKernel.ts, the same bytes) unless `useKernel`
 * is false or WebAssembly is missing.
 */
export function formatPackedBlock(block: PackedBlock, prefix: Uint8Array, form: number, out: Uint8Array, useKernel = true): number {
  const { count, keys, numbers } = block;
  const columns = windowColumnNames.length;
  const inKernel = useKernel
    ? writeCsvRows(
        {
          count,
          columns,
          numbers: numbers.subarray(count, (columns + 1) * count),
          prefix,
          headBytes: stampHeadBytes,
          writeHead: (k, bytes, at) => writeStampHead(bytes, at, form, keys[2 * k]!, keys[2 * k + 1]!, numbers[k]!),
        },
        out,
      )
    : null;
  if (inKernel !== null) return inKernel.length;
  const series = windowColumnNames.map((_, c) => numbers.subarray((c + 1) * count, (c + 2) * count));
  let at = 0;
  for (let k = 0; k < count; k++) {
    at = writeStampRow(out, at, prefix, form, keys[2 * k]!, keys[2 * k + 1]!, numbers[k]!, series, k);
    out[at++] = newline;
  }
  return at;
}

/** The bytes before every row of a pair's CSV: its source and column names. */
export function rollCsvPrefix(meta: RollMeta): Uint8Array {
  return encoder.encode(`${[meta.input.source, meta.input.lowColumn, meta.input.highColumn].map(csvText).join(",")},`);
}
