/**
 * Refuses a run whose output would destroy one of its inputs or another of its outputs: an
 * `--output`, `--chart` or `--report` that names (through any link or relative path) an input file,
 * standard input's file, the config file, or the same file as another output. Character devices
 * (/dev/null, a terminal) are exempt: writing one destroys nothing. A path that names a folder
 * (`report.csv/`) is refused too: folded lexically it would name the file before the slash.
 */
import type { CliIssue } from "./messages.js";
import type { CliIo } from "./runtime/io.js";
import { namesFolder } from "./runtime/output.js";

/** The output options, as flags. */
const outputOptions = [
  ["output", "--output"],
  ["chart", "--chart"],
  ["report", "--report"],
] as const;

/** The first clash between the run's outputs and its inputs or each other, or null. */
export function outputClash(
  io: CliIo,
  inputs: readonly string[],
  options: { readonly [K in (typeof outputOptions)[number][0]]?: string | undefined },
): CliIssue | null {
  const read = new Map<string, string>();
  for (const input of inputs) {
    const name = io.identify(input);
    if (!name.device) read.set(name.key, input);
  }
  const written = new Map<string, string>();
  for (const [key, flag] of outputOptions) {
    const path = options[key];
    if (path === undefined) continue;
    if (namesFolder(path)) return { code: "output-is-folder", option: flag, path };
    const name = io.identify(path);
    if (name.device) continue;
    const input = read.get(name.key);
    if (input !== undefined) return { code: "output-is-input", option: flag, path, input };
    const other = written.get(name.key);
    if (other !== undefined) return { code: "outputs-clash", options: [other, flag], path };
    written.set(name.key, flag);
  }
  return null;
}
