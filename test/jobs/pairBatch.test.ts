import { describe, expect, it } from "vitest";
import type { CommandOptionsInput } from "../../src/options/index.js";
import { type SolvedPair, solveJob, sourcesFrom } from "../../src/jobs/index.js";

/** A weekly file whose books have holes on different rows, and one book written in percent. */
function holedFile(rows: number, seed: number): string {
  let state = seed >>> 0;
  const uniform = (): number => ((state = (Math.imul(state, 1664525) + 1013904223) >>> 0) + 0.5) / 2 ** 32;
  const normal = (): number => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
  const holes: Record<string, (i: number) => boolean> = {
    A: (i) => i % 13 === 3,
    B: (i) => i % 17 === 5,
    D: (i) => i % 11 === 7,
    rf: (i) => i === 30,
  };
  const lines = ["Date,A,B,C,D,Pct,Idx,rf"];
  for (let i = 0; i < rows; i++) {
    const f = 0.01 * normal();
    const values: Record<string, number> = {
      A: 0.6 * f + 0.004 * normal(),
      B: 0.8 * f + 0.004 * normal(),
      C: 1.2 * f + 0.005 * normal(),
      D: 1.4 * f + 0.006 * normal(),
      Pct: 100 * (1.1 * f + 0.005 * normal()),
      Idx: f + 0.002 * normal(),
      rf: 0.0001,
    };
    const date = new Date(Date.UTC(2018, 0, 1) + i * 7 * 86_400_000).toISOString().slice(0, 10);
    const cells = Object.entries(values).map(([name, v]) => (holes[name]?.(i) === true ? "NA" : v.toFixed(6)));
    lines.push([date, ...cells].join(","));
  }
  return `${lines.join("\n")}\n`;
}

const files = { "desk-a.csv": holedFile(90, 1), "desk-b.csv": holedFile(70, 2), "short.csv": holedFile(12, 3) };
const read = sourcesFrom(files);

async function solved(names: string[], options: CommandOptionsInput<"solve">): Promise<readonly SolvedPair[]> {
  const result = await solveJob(names, options, { read });
  if (!result.ok) return expect.fail(result.issues.message);
  return result.value.pairs;
}

/** What a pair's outputs are made of: its record (every format renders it), JSON document, status and messages. */
const outcome = (pair: SolvedPair | undefined) =>
  JSON.stringify(pair === undefined ? null : [pair.record, pair.document, pair.status, pair.messages]);

describe("a run of many pairs solves each as a run of that pair alone", () => {
  it.each([
    [
      "--lows x --highs, holes in different columns, a risk-free column with a hole",
      { lows: ["A", "B", "Pct"], highs: ["C", "D"], rf: "rf" },
    ],
    [
      "--pair, with an index column (rows missing it dropped too)",
      {
        pair: [
          { low: "A", high: "D" },
          { low: "B", high: "C" },
        ],
        index: "Idx",
      },
    ],
    ["a column that is not there, and a pair of a column with itself", { lows: ["A", "Nope", "C"], highs: ["C", "D"] }],
    [
      "percent units (warnings for the books that look decimal) and a constant risk-free rate",
      { lows: ["A", "B"], highs: ["D"], units: "percent", rf: "0.01" },
    ],
  ] as const)("%s", async (_, options) => {
    const names = ["desk-a.csv", "missing.csv", "desk-b.csv", "short.csv"];
    const many = await solved(names, { ...options, format: "jsonl" } as CommandOptionsInput<"solve">);
    const pairs = [
      ...("pair" in options ? options.pair : []),
      ...("lows" in options ? options.lows.flatMap((low) => options.highs.map((high) => ({ low, high }))) : []),
    ];
    const { lows: _l, highs: _h, pair: _p, ...rest } = options as Record<string, unknown>;
    const alone: SolvedPair[] = [];
    for (const name of names)
      for (const pair of pairs) alone.push(...(await solved([name], { ...rest, low: pair.low, high: pair.high, format: "json" })));
    expect(many.length).toBe(alone.length);
    many.forEach((pair, i) => expect(outcome(pair)).toBe(outcome(alone[i])));
    // The holes differ between pairs: so do the rows each pair used.
    const used = new Set(many.flatMap((p) => (p.record.kind === "report" ? [p.record.report.input.rowsUsed] : [])));
    expect(used.size).toBeGreaterThan(2);
  });

  it("--all-pairs orders and solves each pair as --all-pairs of its two columns", async () => {
    const columns = ["D", "A", "C", "B"];
    const many = await solved(["desk-a.csv"], { allPairs: columns, rf: "rf", format: "jsonl" });
    const alone: SolvedPair[] = [];
    for (const [i, low] of columns.entries())
      for (const high of columns.slice(i + 1))
        alone.push(...(await solved(["desk-a.csv"], { allPairs: [low, high], rf: "rf", format: "json" })));
    expect(many.map(outcome)).toEqual(alone.map(outcome));
  });
});
