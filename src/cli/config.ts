/**
 * `--config FILE`: a JSON file holding a job's inputs, pairs and options, for nightly runs. Keys are
 * the long option names in camelCase (`periodsPerYear`, `onMissing`, ...) plus `files`; `pair` may be
 * written as "LOW:HIGH" strings or {"low", "high"} objects. Flags given on the command line override
 * the file. Relative paths in the file are relative to the file's folder, so a job runs the same from
 * any working directory.
 */
import { dirname, isAbsolute, join } from "node:path";
import type { Command } from "commander";
import * as z from "zod";
import { failure, success, type Result } from "../core/result.js";
import type { CliIo } from "./io.js";
import type { CliIssue } from "./messages.js";
import { once } from "./options.js";

const pairEntry = once(() => z.union([
  z.string().regex(/^[^:]+:.+$/, "must be \"LOW:HIGH\""),
  z.strictObject({ low: z.string().min(1), high: z.string().min(1) }),
]));

/** Values a config file may hold; types only here, ranges are checked with the merged options. */
export const configFileSchema = once(() => z.strictObject({
  files: z.array(z.string().min(1)).min(1).optional(),
  low: z.string().optional(),
  high: z.string().optional(),
  pair: z.array(pairEntry()).optional(),
  lows: z.array(z.string()).optional(),
  highs: z.array(z.string()).optional(),
  date: z.string().optional(),
  weight: z.number().optional(),
  rf: z.union([z.string(), z.number()]).optional(),
  units: z.string().optional(),
  steps: z.number().optional(),
  format: z.string().optional(),
  output: z.string().optional(),
  allowExtreme: z.boolean().optional(),
  delimiter: z.string().optional(),
  block: z.number().optional(),
  dateFormat: z.string().optional(),
  sort: z.boolean().optional(),
  decimalComma: z.boolean().optional(),
  periodsPerYear: z.number().optional(),
  missing: z.array(z.string()).optional(),
  onMissing: z.string().optional(),
  input: z.string().optional(),
  idColumn: z.string().optional(),
  valueColumn: z.string().optional(),
  window: z.number().optional(),
  step: z.number().optional(),
  expanding: z.boolean().optional(),
  minPeriods: z.number().optional(),
  uncertainty: z.boolean().optional(),
  confidence: z.number().optional(),
  longRun: z.string().optional(),
  hacKernel: z.string().optional(),
  hacBandwidth: z.string().optional(),
  hacLags: z.number().optional(),
  hacPrewhite: z.boolean().optional(),
  hacAdjust: z.boolean().optional(),
  interval: z.string().optional(),
  intervalSource: z.string().optional(),
  bootstrap: z.number().optional(),
  blockLength: z.union([z.number(), z.literal("auto")]).optional(),
  seed: z.number().optional(),
  threads: z.number().optional(),
  chart: z.string().optional(),
  chartY: z.string().optional(),
  report: z.string().optional(),
}));

export type ConfigFile = z.infer<ReturnType<typeof configFileSchema>>;

/** Reads and validates a config file; paths in it are made relative to its folder. */
export async function readConfig(path: string, io: CliIo): Promise<Result<ConfigFile, CliIssue>> {
  const bytes = await io.readInput(path);
  if (!bytes.ok) return bytes;
  let data: unknown;
  try {
    data = JSON.parse(new TextDecoder().decode(bytes.value));
  } catch (error) {
    return failure({ code: "invalid-config", path, at: "", reason: `not valid JSON (${error instanceof Error ? error.message : String(error)})` });
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
  delete merged["config"];
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
  const path = command.opts()["config"];
  if (typeof path !== "string") {
    const options: Record<string, unknown> = { ...command.opts() };
    delete options["config"];
    return success({ files: [...files], options });
  }
  const config = await readConfig(path, io);
  if (!config.ok) return config;
  return success({ files: files.length > 0 ? [...files] : (config.value.files ?? []), options: mergeWithConfig(command, config.value) });
}
