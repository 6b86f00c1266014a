/**
 * Date-time stamps on the byte path (src/input/values/dateStamps.ts, the row kernel and byteGrid.ts):
 * each stamp gives readUnambiguousDate's key, its text and ISO text come back from the key and the
 * column's form, and a file of stamps reads the same from its bytes (in JavaScript below 64 rows,
 * through the row kernel above) as through the text and the general date reader, including bad,
 * mixed and zoned stamps, duplicates and unsorted rows.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { plainLines } from "../../src/input/engines/plainLines.js";
import { kernelBytes, rowKernelFor } from "../../src/input/engines/rowKernel.js";
import { readReturnsFromBytes, type ReadOptions } from "../../src/input/readReturns.js";
import { readUnambiguousDate } from "../../src/input/values/dates.js";
import {
  NO_FORM,
  PLAIN_DATE_FORM,
  STAMP_FRACTION_SHIFT,
  STAMP_SECONDS,
  STAMP_T,
  STAMP_TIME,
  STAMP_ZULU,
  scanStamp,
  stampIso,
  stampScan,
  stampText,
  MAX_STAMP_ISO_BYTES,
  writeStampIso,
} from "../../src/input/values/dateStamps.js";
import { expectSameRead, throughText } from "./helpers.js";

/** How a generated stamp is written. */
interface Form {
  readonly time: boolean;
  readonly t: boolean;
  readonly seconds: boolean;
  readonly digits: number;
  readonly zulu: boolean;
}

const formArb: fc.Arbitrary<Form> = fc
  .record({ time: fc.boolean(), t: fc.boolean(), seconds: fc.boolean(), digits: fc.integer({ min: 0, max: 3 }), zulu: fc.boolean() })
  .map((f) => (f.time ? { ...f, digits: f.seconds ? f.digits : 0 } : { time: false, t: false, seconds: false, digits: 0, zulu: false }));

const codeOf = (f: Form): number =>
  f.time
    ? STAMP_TIME | (f.t ? STAMP_T : 0) | (f.seconds ? STAMP_SECONDS : 0) | (f.digits << STAMP_FRACTION_SHIFT) | (f.zulu ? STAMP_ZULU : 0)
    : PLAIN_DATE_FORM;

/** The stamp of `ms` (a UTC instant) in form `f`, cut from Date's ISO text: an independent writer. */
function written(ms: number, f: Form): string {
  const iso = new Date(ms).toISOString(); // YYYY-MM-DDTHH:MM:SS.sssZ for years 0 to 9999
  if (!f.time) return iso.slice(0, 10);
  let text = `${iso.slice(0, 10)}${f.t ? "T" : " "}${iso.slice(11, 16)}`;
  if (f.seconds) text += iso.slice(16, 19) + (f.digits > 0 ? iso.slice(19, 20 + f.digits) : "");
  return text + (f.zulu ? "Z" : "");
}

const ascii = (text: string): Uint8Array => Uint8Array.from(text, (c) => c.charCodeAt(0));

/** scanStamp over one field (the text followed by a line feed), from a fresh scan. */
function scanOne(text: string, delimiter = ","): { end: number; key: number; form: number } {
  const bytes = ascii(`${text}\n`);
  const keys = new Float64Array(1);
  const scan = stampScan();
  const end = scanStamp(bytes, 0, text.length, delimiter.charCodeAt(0), keys, 0, scan);
  return { end, key: keys[0] as number, form: scan.form };
}

// Instants from 0001-01-01 to 9999-12-31T23:59:59.999, on whole milliseconds (Date.UTC reads years below 100 as 19xx).
const instant = fc.integer({ min: -62_135_596_800_000, max: 253_402_300_799_999 });

describe("a date stamp", () => {
  it("gives readUnambiguousDate's key, and its text and ISO text come back from the key and the form", () => {
    fc.assert(
      fc.property(instant, formArb, (ms, f) => {
        const text = written(ms, f);
        const general = readUnambiguousDate(text);
        if (general === null || "kind" in general) return expect.fail(`${text} is a date`);
        const read = scanOne(text);
        expect(read).toEqual({ end: text.length, key: general.key, form: codeOf(f) });
        expect(stampText(read.key, read.form)).toBe(text);
        expect(stampIso(read.key, read.form)).toBe(general.iso);
      }),
      { seed: 20261204, numRuns: 2000 },
    );
  });

  it("writes as bytes the ISO text it gives as a string (the roll CSV's dates)", () => {
    const out = new Uint8Array(8 + MAX_STAMP_ISO_BYTES).fill(33);
    fc.assert(
      fc.property(instant, formArb, (ms, f) => {
        const read = scanOne(written(ms, f));
        const end = writeStampIso(read.key, read.form, out, 8);
        const iso = stampIso(read.key, read.form);
        expect(String.fromCharCode(...out.subarray(8, end))).toBe(iso);
        expect(end - 8).toBeLessThanOrEqual(MAX_STAMP_ISO_BYTES);
        expect(out[7]).toBe(33); // nothing before `at`
      }),
      { seed: 20261205, numRuns: 3000 },
    );
  });

  it("reads every fraction of one to three digits as readUnambiguousDate rounds it", () => {
    for (let digits = 1; digits <= 3; digits++)
      for (let n = 0; n < 10 ** digits; n++) {
        const text = `1999-12-31T23:59:59.${String(n).padStart(digits, "0")}`;
        const general = readUnambiguousDate(text);
        if (general === null || "kind" in general) return expect.fail(text);
        const read = scanOne(text);
        expect(read.key, text).toBe(general.key);
        expect(stampText(read.key, read.form)).toBe(text);
        expect(stampIso(read.key, read.form)).toBe(general.iso);
      }
  });

  it("leaves to the text path what is not one of its forms or no date and time", () => {
    const refused = [
      "2021-02-29 10:00",
      "2020-01-01 24:00",
      "2020-01-01 23:60",
      "2020-01-01T23:59:60",
      "2020-01-01 9:30",
      "2020-01-01t09:30",
      "2020-01-01 09:30 ",
      " 2020-01-01 09:30",
      "2020-01-01  09:30",
      "2020-01-01 09:30+01:00",
      "2020-01-01T09:30:00-0530",
      "2020-01-01T09:30:00.1234",
      "2020-01-01T09:30:00.",
      "2020-01-01T09:30.5",
      "2020-01-01 09",
      "2020-01-01 09:3",
      "2020-01-01T09:30:0",
      "2020-01-01Z",
      "0000-01-01 00:00",
    ];
    for (const text of refused) expect(scanOne(text).end, text).toBe(-1);
    // A delimiter that a time could hold ends the field first: only the date is a stamp then.
    expect(scanOne("2020-01-01T09:30", ":").end).toBe(-1);
    expect(scanOne("2020-01-01:09", ":")).toMatchObject({ end: 10, form: PLAIN_DATE_FORM });
  });

  it("holds a column to the form of its first stamp", () => {
    const bytes = ascii("2020-01-01 09:30,2020-01-01 09:31,2020-01-01T09:32\n");
    const keys = new Float64Array(3);
    const scan = stampScan();
    expect(scan.form).toBe(NO_FORM);
    expect(scanStamp(bytes, 0, 50, 44, keys, 0, scan)).toBe(16);
    expect(scanStamp(bytes, 17, 50, 44, keys, 1, scan)).toBe(33);
    expect(scanStamp(bytes, 34, 50, 44, keys, 2, scan)).toBe(-1);
    expect([keys[0], keys[1]]).toEqual([Date.UTC(2020, 0, 1, 9, 30), Date.UTC(2020, 0, 1, 9, 31)]);
  });
});

describe("the row kernel on date-time stamps", () => {
  it("reads a column of stamps itself, with their keys and form", () => {
    const rows = ["Time,A", "2024-02-29 23:59,0.5", "2024-03-01 00:00,-1", "2024-03-01 00:01,2", ""];
    const bytes = ascii(rows.join("\n"));
    const lines = plainLines(bytes);
    const found = rowKernelFor(bytes);
    if (lines === null || found === null) throw new Error("the kernel is available on Node 20");
    const read = found.kernel.scan(found.base, lines.starts, 1, 4, Int32Array.of(-1, 0), 1, 44, 0);
    expect(read.flagged).toBe(0);
    expect(read.badDate).toBe(false);
    expect(read.form).toBe(STAMP_TIME);
    // Date.UTC is the independent reference for the keys
    expect([...read.keys]).toEqual([Date.UTC(2024, 1, 29, 23, 59), Date.UTC(2024, 2, 1, 0, 0), Date.UTC(2024, 2, 1, 0, 1)]);
  });

  it("flags stamps it does not read, and says when one is no time or of another form", () => {
    const rows = [
      "Time,A",
      "2024-01-01T10:00:00.25Z,1",
      "2024-01-01T10:00:01.5Z,1",
      "2024-01-01T10:00:02.25+01:00,1",
      "2024-01-01T24:00:00.00Z,1",
      "",
    ];
    const bytes = ascii(rows.join("\n"));
    const lines = plainLines(bytes);
    const found = rowKernelFor(bytes);
    if (lines === null || found === null) throw new Error("setup");
    const read = found.kernel.scan(found.base, lines.starts, 1, 5, Int32Array.of(-1, 0), 1, 44, 0);
    expect([...read.flags]).toEqual([0, 0, 1, 0]);
    expect(read.form).toBe(STAMP_TIME | STAMP_T | STAMP_SECONDS | (2 << STAMP_FRACTION_SHIFT) | STAMP_ZULU);
    expect(read.badDate).toBe(true);
    expect(read.keys[0]).toBe(Date.UTC(2024, 0, 1, 10, 0, 0, 250));
  });
});

/** Edits that make a generated file harder: another form, no time, a zone, a copy or swap of rows. */
const oddStamp = fc.constantFrom(
  "2021-02-29 10:00",
  "2020-01-01 24:00",
  "2020-01-01T23:59:60",
  "2020-01-01 09:30+01:00",
  "2020-01-01T09:30:00.1234",
  "2020-01-01 9:30",
  " 2020-01-01 09:30",
  "2020-01-01",
  "2020-01-01T09:30Z",
  "",
);
const edit = fc.oneof(
  fc.record({ kind: fc.constant("stamp" as const), text: oddStamp }),
  fc.record({ kind: fc.constantFrom("duplicate" as const, "swap" as const, "missing" as const) }),
);
const stampFile = fc.record({
  form: formArb,
  start: fc.integer({ min: Date.UTC(1960, 0, 1), max: Date.UTC(2030, 0, 1) }),
  // In units of the form's last digit (so that most files have no duplicate stamps).
  steps: fc.constantFrom(1, 7, 60, 1440, 90_061),
  rows: fc.oneof(fc.integer({ min: 3, max: 63 }), fc.integer({ min: 64, max: 300 })),
  edits: fc.array(fc.tuple(fc.nat(), edit), { maxLength: 3 }),
  delimiter: fc.constantFrom(",", ";", "\t", "|"),
  sort: fc.boolean(),
});
type StampFile = typeof stampFile extends fc.Arbitrary<infer T> ? T : never;

function stampFileText({ form, start, steps, rows, edits, delimiter }: StampFile): string {
  const unit = !form.time ? 86_400_000 : !form.seconds ? 60_000 : 10 ** (3 - form.digits);
  const step = steps * unit;
  const lines = Array.from({ length: rows }, (_, r) =>
    [written(start + r * step, form), ((r % 7) - 3) / 1000, ((r % 5) - 2) / 500].map(String),
  );
  for (const [at, e] of edits) {
    const r = at % rows;
    const line = lines[r] as string[];
    if (e.kind === "stamp") line[0] = e.text;
    else if (e.kind === "duplicate") line[0] = (lines[Math.max(0, r - 1)] as string[])[0] as string;
    else if (e.kind === "missing") line[1] = "";
    else [lines[r], lines[(r + 1) % rows]] = [lines[(r + 1) % rows] as string[], line];
  }
  return `Time${delimiter}A${delimiter}B\n${lines.map((cells) => cells.join(delimiter)).join("\n")}\n`;
}

describe("a file of date-time stamps", () => {
  it("reads the same from its bytes, in JavaScript or through the row kernel, as through its text", () => {
    fc.assert(
      fc.property(stampFile, (spec) => {
        const bytes = new TextEncoder().encode(stampFileText(spec));
        const options: ReadOptions = {
          source: "stamps.csv",
          columns: ["A", "B"],
          allowExtreme: true,
          ...(spec.sort ? { sort: true } : {}),
          ...(spec.delimiter === "," ? {} : { delimiter: spec.delimiter }),
        };
        const expected = throughText(bytes, options, "general");
        expectSameRead(readReturnsFromBytes(bytes, options), expected);
        const inKernel = kernelBytes(bytes.length);
        inKernel.set(bytes);
        expectSameRead(readReturnsFromBytes(inKernel, options), expected);
      }),
      { seed: 20261208, numRuns: 300 },
    );
  });

  it("carries the column's form from one kernel chunk to the next (chunks of 16,384 rows here)", () => {
    const rows = 2 * 16_384 + 100;
    const form: Form = { time: true, t: false, seconds: false, digits: 0, zulu: false };
    const stamp = (r: number): string => written(Date.UTC(2020, 0, 1) + r * 60_000, form);
    const line = (r: number, text = stamp(r)): string => `${text},${(r % 7) / 1000},${(r % 5) / 500}`;
    const options: ReadOptions = { source: "stamps.csv", columns: ["A", "B"] };
    const cases = {
      // Every stamp of one form: read, the last date made from its key.
      uniform: (r: number) => line(r),
      // The second chunk written with "T", and a duplicate in the first: its message quotes it as written.
      switched: (r: number) => (r === 100 ? line(r, stamp(99)) : r >= 16_384 ? line(r, stamp(r).replace(" ", "T")) : line(r)),
      // The last row repeats the one before, written with "T".
      lastDiffers: (r: number) => (r === rows - 1 ? line(r, stamp(r - 1).replace(" ", "T")) : line(r)),
    };
    const values: string[][] = [];
    for (const make of Object.values(cases)) {
      const bytes = new TextEncoder().encode(`Time,A,B\n${Array.from({ length: rows }, (_, r) => make(r)).join("\n")}\n`);
      const inKernel = kernelBytes(bytes.length);
      inKernel.set(bytes);
      const read = readReturnsFromBytes(inKernel, options);
      expectSameRead(read, throughText(bytes, options, "general"));
      values.push(read.ok ? [read.value.lastDate] : read.issues.map((i) => ("value" in i ? i.value : "")));
    }
    const last = new Date(Date.UTC(2020, 0, 1) + (rows - 1) * 60_000).toISOString().slice(0, 19);
    expect(values).toEqual([[last], [stamp(99)], [stamp(rows - 2).replace(" ", "T")]]);
  });

  it("mostly reads (so the comparison above is not between two failures)", () => {
    const specs = fc.sample(stampFile, { seed: 20261208, numRuns: 100 });
    const read = specs.filter((spec) => {
      const options: ReadOptions = {
        source: "stamps.csv",
        columns: ["A", "B"],
        allowExtreme: true,
        ...(spec.delimiter === "," ? {} : { delimiter: spec.delimiter }),
      };
      return readReturnsFromBytes(new TextEncoder().encode(stampFileText(spec)), options).ok;
    });
    expect(read.length).toBeGreaterThanOrEqual(25);
  });
});
