/**
 * A job given a file to read by position (a PagedFile, as the CLI gives large files) solves as it does
 * given the file's bytes, and closes the file once, whether it has one pair, several, or two files joined.
 */
import { describe, expect, it } from "vitest";
import { type PagedFile, type ReadSource, solveJob, sourcesFrom } from "../../src/jobs/index.js";
import type { CommandOptionsInput } from "../../src/options/index.js";

/** A daily file of three books and a risk-free column, from a seeded stream. */
function dailyFile(rows: number): string {
  let state = 20261204;
  const uniform = (): number => ((state = (Math.imul(state, 1664525) + 1013904223) >>> 0) + 0.5) / 2 ** 32;
  const lines = ["date,low,high,other,rf"];
  for (let i = 0; i < rows; i++) {
    const f = 0.02 * (uniform() - 0.5);
    const date = new Date(Date.UTC(2010, 0, 1) + i * 86_400_000).toISOString().slice(0, 10);
    const books = [0.6, 1.4, 1.1].map((beta) => (beta * f + 0.01 * (uniform() - 0.5)).toFixed(6));
    lines.push([date, ...books, "0.0001"].join(","));
  }
  return `${lines.join("\n")}\n`;
}

const text = dailyFile(400);
const bytes = new TextEncoder().encode(text);

/** The file as a PagedFile through a 256-byte window, counting its closes. */
function pagedSource(): { read: ReadSource; closes: () => number } {
  let closes = 0;
  const file = (): PagedFile => ({
    size: bytes.length,
    window: 256,
    read: (position, target, offset, length) => {
      const count = Math.max(0, Math.min(length, bytes.length - position));
      target.set(bytes.subarray(position, position + count), offset);
      return count;
    },
    close: () => {
      closes++;
    },
  });
  return { read: async () => ({ ok: true, value: file() }), closes: () => closes };
}

async function documents(read: ReadSource, files: string[], options: CommandOptionsInput<"solve">): Promise<string> {
  const result = await solveJob(files, { uncertainty: false, ...options }, { read });
  if (!result.ok) return expect.fail(result.issues.message);
  return JSON.stringify(result.value.pairs.map((pair) => [pair.record, pair.document, pair.status]));
}

/** The file through a reader that fails half-way, saying why (as the CLI's does when the file shrinks). */
const failing: ReadSource = async () => {
  let failed = false;
  const file: PagedFile = {
    size: bytes.length,
    window: 256,
    read: (position, target, offset, length) => {
      if (position > bytes.length / 2) {
        failed = true;
        return 0;
      }
      const count = Math.min(length, bytes.length - position);
      target.set(bytes.subarray(position, position + count), offset);
      return count;
    },
    close: () => undefined,
    failure: () => (failed ? why : null),
  };
  return { ok: true, value: file };
};
const why = { code: "read-failed", message: "cannot read 'daily.csv': it shrank" };

describe("a job reading a file by position", () => {
  it("reports why a read failed meanwhile, as when the file cannot be read at all", async () => {
    const options = { low: "low", high: "high", rf: "rf" };
    const unreadable: ReadSource = async () => ({ ok: false, issues: why });
    expect(await documents(failing, ["daily.csv"], options)).toBe(await documents(unreadable, ["daily.csv"], options));
  });

  it.each([
    ["one pair", ["daily.csv"], { low: "low", high: "high", rf: "rf" }],
    ["several pairs", ["daily.csv"], { lows: ["low", "other"], highs: ["high"], rf: "rf" }],
    ["two files joined", [], { low: "daily.csv:low", high: "daily.csv:high" }],
  ] as const)("solves as from the bytes and closes each file it opened once: %s", async (_, files, options) => {
    const paged = pagedSource();
    const expected = await documents(sourcesFrom({ "daily.csv": text }), [...files], options);
    expect(await documents(paged.read, [...files], options)).toBe(expected);
    expect(paged.closes()).toBe(files.length === 0 ? 2 : 1);
  });
});
