/**
 * `--config FILE`: a JSON file holding a job's inputs, pairs and options, for nightly runs. Keys are
 * the long option names in camelCase (`periodsPerYear`, `onMissing`, ...) plus `files`; `pair` may be
 * written as "LOW:HIGH" strings or {"low", "high"} objects. Flags given on the command line override
 * the file. Relative paths in the file are relative to the file's folder, so a job runs the same from
 * any working directory.
 */
import { dirname, isAbsolute, join } from "node:path";
import type { Command } from "commander";
import * as z from "zod/mini";
import { failure, success, type Result } from "../core/result.js";
import type { CliIo } from "./runtime/io.js";
import type { CliIssue } from "./messages.js";
import { once } from "./options.js";

const pairEntry = once(() =>
  z.union([
    z.string().check(z.regex(/^[^:]+:.+$/, 'must be "LOW:HIGH"')),
    z.strictObject({ low: z.string().check(z.minLength(1)), high: z.string().check(z.minLength(1)) }),
  ]),
);

/** Values a config file may hold; types only here, ranges are checked with the merged options. */
export const configFileSchema = once(() =>
  z.strictObject({
    files: z.optional(z.array(z.string().check(z.minLength(1))).check(z.minLength(1))),
    low: z.optional(z.string()),
    high: z.optional(z.string()),
    pair: z.optional(z.array(pairEntry())),
    lows: z.optional(z.array(z.string())),
    highs: z.optional(z.array(z.string())),
    date: z.optional(z.string()),
    weight: z.optional(z.number()),
    rf: z.optional(z.union([z.string(), z.number()])),
    units: z.optional(z.string()),
    steps: z.optional(z.number()),
    format: z.optional(z.string()),
    output: z.optional(z.string()),
    allowExtreme: z.optional(z.boolean()),
    delimiter: z.optional(z.string()),
    block: z.optional(z.number()),
    dateFormat: z.optional(z.string()),
    sort: z.optional(z.boolean()),
    decimalComma: z.optional(z.boolean()),
    periodsPerYear: z.optional(z.number()),
    missing: z.optional(z.array(z.string())),
    onMissing: z.optional(z.string()),
    input: z.optional(z.string()),
    idColumn: z.optional(z.string()),
    valueColumn: z.optional(z.string()),
    window: z.optional(z.number()),
    step: z.optional(z.number()),
    expanding: z.optional(z.boolean()),
    minPeriods: z.optional(z.number()),
    uncertainty: z.optional(z.boolean()),
    confidence: z.optional(z.number()),
    longRun: z.optional(z.string()),
    hacKernel: z.optional(z.string()),
    hacBandwidth: z.optional(z.string()),
    hacLags: z.optional(z.number()),
    hacPrewhite: z.optional(z.boolean()),
    hacAdjust: z.optional(z.boolean()),
    interval: z.optional(z.string()),
    intervalSource: z.optional(z.string()),
    bootstrap: z.optional(z.number()),
    blockLength: z.optional(z.union([z.number(), z.literal("auto")])),
    seed: z.optional(z.number()),
    threads: z.optional(z.number()),
    chart: z.optional(z.string()),
    chartY: z.optional(z.string()),
    report: z.optional(z.string()),
  }),
);

export type ConfigFile = z.infer<ReturnType<typeof configFileSchema>>;

/** Reads and validates a config file; paths in it are made relative to its folder. */
export async function readConfig(path: string, io: CliIo): Promise<Result<ConfigFile, CliIssue>> {
  const bytes = await io.readInput(path);
  if (!bytes.ok) return bytes;
  let data: unknown;
  try {
    data = JSON.parse(new TextDecoder().decode(bytes.value));
  } catch (error) {
    return failure({
      code: "invalid-config",
      path,
      at: "",
      reason: `not valid JSON (${error instanceof Error ? error.message : String(error)})`,
    });
  }
  const parsed = configFileSchema().safeParse(data);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const at = (issue?.path ?? []).map(String).join(".");
    return failure({ code: "invalid-config", path, at, reason: issue?.message ?? "invalid" });
  }
  const folder = dirname(path);
  const relative = (p: string): string => (p === "-" || isAbsolute(p) ? p : join(folder, p));
  const config = parsed.data;
  return success({
    ...config,
    ...(config.files === undefined ? {} : { files: config.files.map(relative) }),
    ...(config.output === undefined ? {} : { output: relative(config.output) }),
    ...(config.chart === undefined ? {} : { chart: relative(config.chart) }),
    ...(config.report === undefined ? {} : { report: relative(config.report) }),
  });
}

/**
 * The options of `command` with the config file underneath: a value from the file is used unless the
 * option was given on the command line. Keys the command does not have are ignored (a file may serve
 * several commands).
 */
export function mergeWithConfig(command: Command, config: ConfigFile): Record<string, unknown> {
  const merged: Record<string, unknown> = { ...command.opts() };
  delete merged.config;
  const known = new Set(command.options.map((o) => o.attributeName()));
  for (const [key, value] of Object.entries(config)) {
    if (key === "files" || !known.has(key)) continue;
    if (command.getOptionValueSource(key) === "cli") continue;
    merged[key] = normalise(key, value);
  }
  return merged;
}

function normalise(key: string, value: unknown): unknown {
  if (key === "rf" && typeof value === "number") return String(value);
  if (key === "pair" && Array.isArray(value)) {
    return value.map((entry) => {
      if (typeof entry !== "string") return entry;
      const at = entry.indexOf(":");
      return { low: entry.slice(0, at).trim(), high: entry.slice(at + 1).trim() };
    });
  }
  return value;
}

/** The files and merged options of a command invocation, reading `--config` when given. */
export async function withConfig(
  command: Command,
  files: readonly string[],
  io: CliIo,
): Promise<Result<{ files: string[]; options: Record<string, unknown> }, CliIssue>> {
  const path = command.opts().config;
  if (typeof path !== "string") {
    const options: Record<string, unknown> = { ...command.opts() };
    delete options.config;
    return success({ files: [...files], options });
  }
  const config = await readConfig(path, io);
  if (!config.ok) return config;
  return success({ files: files.length > 0 ? [...files] : (config.value.files ?? []), options: mergeWithConfig(command, config.value) });
}
