import { describe, expect, it } from "vitest";
import type { WindowUncertainty } from "../../src/core/inference/windowUncertainty.js";
import { createRandom } from "../../src/core/numerics/rng.js";
import { rollSolveColumnBlocks, rollSolveColumns, type WindowColumns, windowColumnNames } from "../../src/core/rolling/index.js";
import { csvText } from "../../src/report/csv.js";
import {
  PLAIN_DATE_FORM,
  STAMP_FRACTION_SHIFT,
  STAMP_SECONDS,
  STAMP_TIME,
  STAMP_ZULU,
  stampIso,
} from "../../src/input/values/dateStamps.js";
import {
  formatPackedBlock,
  type PackedBlock,
  packBlock,
  rollCsvHeader,
  rollCsvPrefix,
  stampRowBytes,
  uncertaintyColumnNames,
  writeRollCsv,
} from "../../src/report/rollCsv.js";
import type { RollMeta } from "../../src/report/rollReport.js";
import { input } from "./fixtures.js";

/**
 * The rows as strings, the way they were written before bytes: String(x) for a number, an empty
 * field for NaN, lines joined. The byte writer must give exactly this text.
 */
function referenceRows(meta: RollMeta, columns: WindowColumns, uncertainty: ((k: number) => WindowUncertainty | null) | null): string {
  const cell = (x: number): string => (Number.isNaN(x) ? "" : String(x));
  const prefix = [meta.input.source, meta.input.lowColumn, meta.input.highColumn].map(csvText).join(",");
  const series = windowColumnNames.map((name) => columns.columns[name]);
  let text = "";
  for (let k = 0; k < columns.count; k++) {
    let line = `${prefix},${meta.dates[columns.start[k]!]},${meta.dates[columns.end[k]!]},${columns.observations[k]}`;
    for (const values of series) line += `,${cell(values[k]!)}`;
    if (uncertainty !== null) {
      const u = uncertainty(k);
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
      for (const x of values) line += `,${cell(x)}`;
      line += `,${u?.pricing?.verdict ?? ""}`;
    }
    text += `${line}\n`;
  }
  return text;
}

/** Returns of two books with a flat stretch (rejected windows: NaN bounds) and a market run. */
function books(rows: number, seed: number) {
  const random = createRandom(seed);
  const low: number[] = [];
  const high: number[] = [];
  for (let t = 0; t < rows; t++) {
    const market = 0.01 * random.normal();
    const flat = t >= 200 && t < 290;
    low.push(flat ? 0.001 : 0.0003 + 0.7 * market + 0.004 * random.normal());
    high.push(flat ? 0.002 : 0.0011 + 1.3 * market + 0.004 * random.normal());
  }
  return { low, high };
}

function dates(rows: number, decorate: (t: number) => string = (t) => `d${t}`): string[] {
  return Array.from({ length: rows }, (_, t) => decorate(t));
}

function metaOf(source: string, rowDates: string[]): RollMeta {
  return {
    tool: { name: "betabound", version: "0.1.0-test" },
    input: { ...input, source },
    spec: { kind: "window", size: 60, step: 1 },
    weight: 0.5,
    dates: rowDates,
    inputWarnings: [],
  };
}

/** Every byte handed over, copied as it comes (the writer reuses its buffer once a write resolves). */
async function written(
  meta: RollMeta,
  blocks: Iterable<WindowColumns>,
  uncertainty: ((k: number) => WindowUncertainty | null) | null = null,
): Promise<{ text: string; writes: number }> {
  const pieces: Buffer[] = [];
  let k = 0;
  const inOrder = uncertainty === null ? null : () => uncertainty(k++);
  await writeRollCsv(meta, blocks, inOrder, async (bytes) => void pieces.push(Buffer.from(bytes)));
  return { text: Buffer.concat(pieces).toString("utf8"), writes: pieces.length };
}

/** A window's uncertainty with the fields the CSV reads; `gaps` turns its optional numbers to null. */
function uncertaintyOf(random: ReturnType<typeof createRandom>, gaps: boolean): WindowUncertainty {
  const bound = () => ({ estimate: random.normal(), stdError: 0.01 * random.uniform(), lower: random.normal(), upper: random.normal() });
  const maybe = (x: number): number | null => (gaps && random.uniform() < 0.5 ? null : x);
  const verdicts = ["explained", "not explained", "undetermined", null] as const;
  return {
    confidence: 0.95,
    bounds: { lowBeta: { min: bound(), max: bound() }, highBeta: { min: bound(), max: bound() }, correlation: random.uniform() },
    lowBeta: { interval: { lower: random.normal(), upper: random.normal(), method: "stoye", criticalValue: { lower: 1.6, upper: 1.6 } } },
    pricing:
      gaps && random.uniform() < 0.2
        ? null
        : {
            returnImpliedLowBeta: {
              estimate: maybe(random.normal()),
              stdError: maybe(random.uniform() / 3),
              lower: maybe(-random.uniform()),
              upper: maybe(random.uniform() * 1e-7),
              bounded: true,
            },
            pValue: maybe(random.uniform()),
            explainedPValue: maybe(random.uniform()),
            verdict: verdicts[Math.floor(4 * random.uniform())]!,
          },
  } as unknown as WindowUncertainty;
}

describe("roll's CSV rows as bytes", () => {
  const rows = 3000;
  const { low, high } = books(rows, 7);
  const spec = { kind: "window", size: 60, step: 1 } as const;
  const columns = rollSolveColumns(low, high, 0.0001, 0.5, spec);
  /** The same columns in blocks of 333 windows, in reused arrays (as roll writes them). */
  const blocks = () => rollSolveColumnBlocks(low, high, 0.0001, 0.5, spec, 333);

  it("are the reference text byte for byte, rejected windows' empty fields included, over many buffers", async () => {
    const meta = metaOf(
      "returns.csv",
      dates(rows, (t) => `2000-01-${String(t).padStart(5, "0")}`),
    );
    const { text, writes } = await written(meta, blocks());
    expect(columns.columns.lowBetaMin.some(Number.isNaN)).toBe(true); // the flat stretch's windows
    expect(writes).toBeGreaterThan(1); // more than one buffer's worth, so the buffer was reused
    expect(text).toBe(referenceRows(meta, columns, null));
  });

  it("write every kind of number as String(x) does: zeros, integers, tiny, huge, subnormal, infinite", async () => {
    const odd = [0, -0, 1, -7, 1e21, 1e-7, 5e-324, 2.2250738585072014e-308, 0.1 + 0.2, 1e16, -1e-6, Number.POSITIVE_INFINITY];
    const lowMean = columns.columns.lowMean.slice();
    odd.forEach((x, i) => {
      columns.columns.lowMean[i] = x;
    });
    try {
      const meta = metaOf("returns.csv", dates(rows));
      expect((await written(meta, [columns])).text).toBe(referenceRows(meta, columns, null));
    } finally {
      columns.columns.lowMean.set(lowMean);
    }
  });

  it("quote the file's name and carry non-ASCII names and dates as UTF-8", async () => {
    const meta = metaOf(
      'données "brutes", 2024.csv',
      dates(rows, (t) => `${t} März ☃ 𝔁`),
    );
    expect((await written(meta, blocks())).text).toBe(referenceRows(meta, columns, null));
  });

  it("add the --uncertainty columns as the reference does, with windows and fields that have none", async () => {
    const random = createRandom(3);
    const table = Array.from({ length: columns.count }, (_, k) => (k % 7 === 0 ? null : uncertaintyOf(random, k % 2 === 0)));
    const at = (k: number) => table[k]!;
    const meta = metaOf("returns.csv", dates(rows));
    const { text } = await written(meta, blocks(), at);
    expect(text).toBe(referenceRows(meta, columns, at));
    expect(text.split("\n")[0]!.split(",")).toHaveLength(rollCsvHeader(true).split(",").length);
    expect(uncertaintyColumnNames).toHaveLength(11);
  });

  it("take a row longer than the buffer (a very long date)", async () => {
    const meta = metaOf(
      "returns.csv",
      dates(rows, (t) => `${t}-${"x".repeat(t === 100 ? 2_000_000 : 3)}`),
    );
    const few = rollSolveColumns(low.slice(0, 200), high.slice(0, 200), 0.0001, 0.5, { kind: "window", size: 60, step: 1 });
    expect((await written(meta, [few])).text).toBe(referenceRows(meta, few, null));
  });

  // Dates that are stamps: the rows come from their keys (writeStampIso), in this thread and, packed a
  // block at a time, in the CSV's worker thread (cli/runtime/rollCsvThreads.ts).
  const minute = 60_000;
  const keys = Float64Array.from({ length: rows }, (_, t) => Date.UTC(1999, 11, 30) + t * 37 * minute + (t % 1000));
  const forms = [PLAIN_DATE_FORM, STAMP_TIME | STAMP_SECONDS | (3 << STAMP_FRACTION_SHIFT) | STAMP_ZULU];

  it("write stamps from their keys as the dates' text would be written", async () => {
    for (const form of forms) {
      const isos = Array.from(keys, (key) => stampIso(key, form));
      const meta: RollMeta = { ...metaOf("returns.csv", isos), stamps: { keys, form } };
      expect((await written(meta, blocks())).text).toBe(referenceRows(meta, columns, null));
    }
  });

  it("are the same packed a block at a time and formatted elsewhere", () => {
    for (const form of forms) {
      const meta: RollMeta = {
        ...metaOf(
          "re,turns.csv",
          Array.from(keys, (key) => stampIso(key, form)),
        ),
        stamps: { keys, form },
      };
      const prefix = rollCsvPrefix(meta);
      const packed: PackedBlock = {
        count: 0,
        keys: new Float64Array(2 * 333),
        numbers: new Float64Array((1 + windowColumnNames.length) * 333),
      };
      const out = new Uint8Array(333 * stampRowBytes(prefix.length, windowColumnNames.length));
      const pieces: Buffer[] = [];
      for (const block of blocks()) {
        packBlock(block, keys, packed);
        pieces.push(Buffer.from(out.subarray(0, formatPackedBlock(packed, prefix, form, out))));
      }
      expect(Buffer.concat(pieces).toString("utf8")).toBe(referenceRows(meta, columns, null));
    }
  });
});
