/**
 * `--config FILE`: a JSON file holding a job's files and options (src/options/config.ts checks it).
 * Flags given on the command line override the file. Relative paths in the file (files, --output,
 * --chart, --report) are relative to the file's folder, so a job runs the same from any folder.
 */
import { dirname, isAbsolute, join } from "node:path";
import type { Command } from "commander";
import { failure, type Result, success } from "../core/result.js";
import { type CommandName, parseConfigJobs, pathOptions } from "../options/index.js";
import type { CliIssue } from "./messages.js";
import type { CliIo } from "./runtime/io.js";

/** One job: its files and options. */
export interface ConfiguredJob {
  readonly files: string[];
  readonly options: Record<string, unknown>;
}

/**
 * The files and options of a command invocation: the flags, over the config file when one is given;
 * `jobs`, one per job of the file (a file without "jobs" is one job), and `files` and `options`, the first.
 */
export async function withConfig(
  command: Command,
  name: CommandName,
  files: readonly string[],
  io: CliIo,
): Promise<Result<ConfiguredJob & { jobs: ConfiguredJob[]; configFile?: string }, CliIssue>> {
  const flags: Record<string, unknown> = { ...command.opts() };
  const path = flags.config;
  delete flags.config;
  if (typeof path !== "string") {
    const only = { files: [...files], options: flags };
    return success({ ...only, jobs: [only] });
  }
  const bytes = await io.readInput(path);
  if (!bytes.ok) return bytes;
  const contents = parseConfigJobs(new TextDecoder().decode(bytes.value), name);
  if (!contents.ok) return failure({ code: "invalid-config", path, at: contents.issues.at, reason: contents.issues.reason });
  const folder = dirname(path);
  const relative = (p: string): string => (p === "-" || isAbsolute(p) ? p : join(folder, p));
  const paths = new Set(pathOptions(name));
  const jobs = contents.value.map((job) => {
    const options: Record<string, unknown> = { ...flags };
    for (const [key, value] of Object.entries(job.values)) {
      if (command.getOptionValueSource(key) === "cli") continue;
      options[key] = paths.has(key) && typeof value === "string" ? relative(value) : value;
    }
    return { files: files.length > 0 ? [...files] : (job.files ?? []).map(relative), options };
  });
  const first = jobs[0] ?? { files: [...files], options: flags };
  return success({ ...first, jobs, configFile: path });
}
