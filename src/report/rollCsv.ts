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
    const out = this.buffer;
    let at = this.position;
    for (let c = 0; c < series.length; c++) {
      out[at++] = comma;
      const x = series[c]![k]!;
      if (!Number.isNaN(x)) at = writeNumber(x, out, at);
    }
    this.position = at;
  }

  /** A field: String(x), or nothing for NaN (an undefined quantity). */
  number(x: number): void {
    if (!Number.isNaN(x)) this.position = writeNumber(x, this.buffer, this.position);
  }

  /** A date stamp's ISO text (see writeStampIso). */
  stamp(key: number, form: number): void {
    this.position = writeStampIso(key, form, this.buffer, this.position);
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
  const prefix = encoder.encode(`${[meta.input.source, meta.input.lowColumn, meta.input.highColumn].map(csvText).join(",")},`);
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
      } else {
        const room = rowBytesButDates + 2 * MAX_STAMP_ISO_BYTES;
        if (!out.fits(room)) await out.makeRoom(room);
        out.bytes(prefix);
        out.stamp(stamps.keys[start[k]!]!, stamps.form);
        out.byte(comma);
        out.stamp(stamps.keys[end[k]!]!, stamps.form);
      }
      out.byte(comma);
      out.number(observations[k]!);
      out.fields(series, k);
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
