/**
 * The option table: one definition per option, consistent with itself, and the same rule and words
 * whether a value comes from a flag, a config file or a library call.
 */
import { describe, expect, expectTypeOf, it } from "vitest";
import { run } from "../../src/cli/program.js";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import {
  type CommandName,
  type CommandOptions,
  commandNames,
  defaultsFor,
  entriesFor,
  flagOf,
  type OptionSpec,
  optionsSchema,
  optionTable,
  parseConfig,
  refusalOf,
} from "../../src/options/index.js";
import { readReturns } from "../../src/input/index.js";
import { optionTableParts } from "../../src/options/table.js";
import { fakeIo } from "../cli/fakeIo.js";

const entries = Object.entries(optionTable) as [string, OptionSpec<unknown>][];

/** A value each kind refuses, as a flag's text and as a JSON value. */
function refusedValue(entry: OptionSpec<unknown>): { text: string; json: unknown } | null {
  const texts = ["", "nope", "1.3", "-1", "2.5", "0", "1e300", "-1e300", "abc,", "1,2,3,4", "9999999999999999999"];
  for (const text of texts) {
    if (entry.kind.parse(text, undefined) !== undefined) continue;
    const number = Number(text);
    return { text, json: text === "" || Number.isNaN(number) ? text : number };
  }
  return null;
}

describe("the option table", () => {
  it("has no entry of one part hidden by another's (the parts' keys are distinct)", () => {
    const keys = optionTableParts.flatMap((part) => Object.keys(part));
    expect(new Set(keys).size).toBe(keys.length);
    expect(keys).toEqual(Object.keys(optionTable));
  });

  it("gives each option of a command a unique name and flag", () => {
    for (const command of commandNames) {
      const names = entriesFor(command, { withFlagOnly: true }).map((e) => e.name);
      expect(new Set(names).size, command).toBe(names.length);
    }
  });

  it("shares a name between entries only when they never share a command", () => {
    for (const [key, entry] of entries) {
      for (const [otherKey, other] of entries) {
        if (key >= otherKey || entry.name !== other.name) continue;
        expect(
          entry.commands.filter((c) => other.commands.includes(c)),
          `${key} and ${otherKey}`,
        ).toEqual([]);
      }
    }
  });

  it("has defaults its own rule accepts, and never a default beside a requirement", () => {
    for (const [key, entry] of entries) {
      if (entry.default !== undefined) expect(entry.kind.schema().safeParse(entry.default).success, key).toBe(true);
      expect(entry.default !== undefined && entry.required === true, key).toBe(false);
      // A switch is off unless given, or written --no-x when it is on.
      if (entry.argument === undefined) expect(entry.default === true, key).toBe(entry.negated === true);
    }
  });

  it("fills every default into a library call's options", () => {
    for (const command of ["solve", "roll"] as const) {
      const parsed = optionsSchema(command).safeParse({ low: "a", high: "b", ...(command === "roll" ? { window: 12 } : {}) });
      expect(parsed.success, command).toBe(true);
      if (parsed.success)
        for (const [name, value] of Object.entries(defaultsFor(command))) expect(parsed.data[name as never], name).toEqual(value);
    }
  });

  it("types each command's options from the table", () => {
    expectTypeOf<CommandOptions<"solve">["weight"]>().toEqualTypeOf<number>();
    expectTypeOf<CommandOptions<"solve">["format"]>().toEqualTypeOf<"text" | "json" | "csv" | "jsonl" | "summary-csv">();
    expectTypeOf<CommandOptions<"roll">["format"]>().toEqualTypeOf<"text" | "csv" | "jsonl">();
    expectTypeOf<CommandOptions<"solve">["hacLags"]>().toEqualTypeOf<number | undefined>();
    expectTypeOf<CommandOptions<"solve">["blockLength"]>().toEqualTypeOf<number | "auto">();
    expectTypeOf<CommandOptions<"simulate">["names"]>().toEqualTypeOf<readonly string[]>();
    expectTypeOf<CommandOptions<"implied">["lowBeta"]>().toEqualTypeOf<number>();
    expectTypeOf<CommandOptions<"implied">["rf"]>().toEqualTypeOf<number>();
    expectTypeOf<CommandOptions<"solve">["rf"]>().toEqualTypeOf<string | undefined>();
    expectTypeOf<CommandOptions<"solve">>().not.toHaveProperty("config");
    expectTypeOf<CommandOptions<"implied">>().not.toHaveProperty("window");
  });
});

/** The smallest valid command line of each command (besides the option under test). */
const baseline: Record<CommandName, string[]> = {
  solve: ["solve", "m.csv", "--low", "a", "--high", "b"],
  roll: ["roll", "m.csv", "--low", "a", "--high", "b", "--window", "12"],
  implied: ["implied", "--low-beta", "0.7", "--factor-vol", "0.01", "--low-noise-vol", "0.01", "--high-noise-vol", "0.01"],
  simulate: [
    "simulate",
    "--low-beta",
    "0.7",
    "--factor-vol",
    "0.01",
    "--low-noise-vol",
    "0.01",
    "--high-noise-vol",
    "0.01",
    "--periods",
    "3",
  ],
};
const baselineOptions: Record<CommandName, Record<string, unknown>> = {
  solve: { low: "a", high: "b" },
  roll: { low: "a", high: "b", window: 12 },
  implied: { lowBeta: 0.7, factorVol: 0.01, lowNoiseVol: 0.01, highNoiseVol: 0.01 },
  simulate: { lowBeta: 0.7, factorVol: 0.01, lowNoiseVol: 0.01, highNoiseVol: 0.01, periods: 3 },
};

describe("one rule, one message", () => {
  const cases = entries.flatMap(([key, entry]) => {
    const refused = entry.argument === undefined ? null : refusedValue(entry);
    return refused === null ? [] : entry.commands.map((command) => [`${command} ${flagOf(entry.name)}`, key, command, refused] as const);
  });

  it("finds a refused value for every option that takes one", () => {
    const withValues = entries.filter(([, e]) => e.argument !== undefined && e.name !== "config").map(([key]) => key);
    const covered = new Set(cases.map(([, key]) => key));
    expect(withValues.filter((key) => !covered.has(key))).toEqual([]);
  });

  it.each(cases)("%s: the flag, the config file and the library refuse it in the same words", async (_, key, command, refused) => {
    const entry = optionTable[key as keyof typeof optionTable] as OptionSpec<unknown>;
    const expected = refusalOf(entry.kind, refused.text);
    // The flag.
    const { io, stderr } = fakeIo({ "m.csv": "date,a,b\n" });
    expect(await run([...baseline[command], `${flagOf(entry.name)}=${refused.text}`], io)).toBe(exitCodes.usage);
    expect(stderr()).toContain(`is invalid. ${expected}`);
    if (entry.flagOnly === true) return;
    // The library.
    const parsed = optionsSchema(command).safeParse({ ...baselineOptions[command], [entry.name]: refused.json });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues[0]?.message).toBe(expected);
    // The config file (solve and roll read one).
    if (command === "solve" || command === "roll") {
      const config = parseConfig(JSON.stringify({ [entry.name]: refused.json }), command);
      expect(config.ok).toBe(false);
      if (!config.ok) expect(config.issues).toEqual({ at: entry.name, reason: expected });
    }
  });

  it.each([
    ["delimiter", '"'],
    ["dateFormat", "XYZ"],
    ["block", 0],
    ["periodsPerYear", -12],
  ] as const)("the input layer (readReturns) refuses %s = %j in the option table's words", (name, value) => {
    const entry = entries.find(([, e]) => e.name === name && e.commands.includes("solve"))![1];
    const read = readReturns("date,a,b\n2024-01-31,0.01,0.02\n", { source: "f.csv", columns: ["a", "b"], [name]: value });
    expect(read.ok).toBe(false);
    if (!read.ok)
      expect(read.issues[0]).toMatchObject({ code: "invalid-option", option: name, reason: refusalOf(entry.kind, String(value)) });
  });

  it("the long layout's rule is the input layer's, in its words", async () => {
    const { io, stderr } = fakeIo({ "m.csv": "date,a,b\n" });
    expect(await run([...baseline.solve, "--id-column", "series"], io)).toBe(exitCodes.usage);
    const read = readReturns("d,s,v\n", { source: "f.csv", columns: ["a"], idColumn: "s" });
    expect(read.ok).toBe(false);
    if (!read.ok) expect(stderr()).toContain((read.issues[0] as { reason: string }).reason);
  });
});
