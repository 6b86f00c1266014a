/**
 * `--config FILE`: a JSON file holding a job's files and options (src/options/config.ts checks it).
 * Flags given on the command line override the file. Relative paths in the file (files, --output,
 * --chart, --report) are relative to the file's folder, so a job runs the same from any folder.
 */
import { dirname, isAbsolute, join } from "node:path";
import type { Command } from "commander";
import { failure, type Result, success } from "../core/result.js";
import { type CommandName, parseConfig, pathOptions } from "../options/index.js";
import type { CliIssue } from "./messages.js";
import type { CliIo } from "./runtime/io.js";

/** The files and options of a command invocation: the flags, over the config file when one is given. */
export async function withConfig(
  command: Command,
  name: CommandName,
  files: readonly string[],
  io: CliIo,
): Promise<Result<{ files: string[]; options: Record<string, unknown>; configFile?: string }, CliIssue>> {
  const options: Record<string, unknown> = { ...command.opts() };
  const path = options.config;
  delete options.config;
  if (typeof path !== "string") return success({ files: [...files], options });
  const bytes = await io.readInput(path);
  if (!bytes.ok) return bytes;
  const contents = parseConfig(new TextDecoder().decode(bytes.value), name);
  if (!contents.ok) return failure({ code: "invalid-config", path, at: contents.issues.at, reason: contents.issues.reason });
  const folder = dirname(path);
  const relative = (p: string): string => (p === "-" || isAbsolute(p) ? p : join(folder, p));
  const paths = new Set(pathOptions(name));
  for (const [key, value] of Object.entries(contents.value.values)) {
    if (command.getOptionValueSource(key) === "cli") continue;
    options[key] = paths.has(key) && typeof value === "string" ? relative(value) : value;
  }
  return success({ files: files.length > 0 ? [...files] : (contents.value.files ?? []).map(relative), options, configFile: path });
}
