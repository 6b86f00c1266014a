/**
 * Failures the CLI itself detects (reading and writing files, option values), as typed values with
 * stable codes. All of their wording is here.
 */
import { flagOf, type OptionIssue } from "../options/index.js";

export type CliIssue =
  | { readonly code: "no-input" }
  | { readonly code: "read-failed"; readonly path: string; readonly reason: string }
  | { readonly code: "write-failed"; readonly path: string; readonly reason: string }
  | { readonly code: "input-too-large"; readonly path: string; readonly size: number | null; readonly limit: number }
  | { readonly code: "stdout-failed"; readonly reason: string }
  | { readonly code: "output-is-input"; readonly option: string; readonly path: string; readonly input: string }
  | { readonly code: "outputs-clash"; readonly options: readonly [string, string]; readonly path: string }
  | { readonly code: "output-is-folder"; readonly option: string; readonly path: string }
  | { readonly code: "too-many-files"; readonly reason: string }
  | { readonly code: "invalid-config"; readonly path: string; readonly at: string; readonly reason: string };

export function describeCliIssue(issue: CliIssue): string {
  switch (issue.code) {
    case "no-input":
      return "no input: give a CSV file path, or '-' and pipe the data on standard input";
    case "read-failed":
      return `cannot read '${issue.path}': ${issue.reason}; check the path and its permissions`;
    case "write-failed":
      return `cannot write '${issue.path}': ${issue.reason}; nothing was written and any existing file is unchanged`;
    case "input-too-large":
      return `'${issue.path}' ${issue.size === null ? "holds more" : `holds ${gib(issue.size)} (${issue.size} bytes), more`} than the input limit of ${gib(issue.limit)} (${issue.limit} bytes); split the file by date or by columns and run each part`;
    case "stdout-failed":
      return `cannot write to standard output: ${issue.reason}; the output is incomplete`;
    case "output-is-input":
      return `${issue.option} '${issue.path}' is ${issue.input === "-" ? "standard input" : `the input '${issue.input}'`}: writing it would destroy the input; choose another output path`;
    case "outputs-clash":
      return `${issue.options[0]} and ${issue.options[1]} both name '${issue.path}': one would overwrite the other; give each output its own path`;
    case "output-is-folder":
      return `${issue.option} '${issue.path}' names a folder (it ends in '/', '.' or '..'), not a file; give the file's path`;
    case "too-many-files":
      return `${issue.reason}: most likely the process's limit of open files (drawing charts opens a few hundred modules); raise it (ulimit -n 1024) and run again; no file was replaced`;
    case "invalid-config":
      return `config file '${issue.path}'${issue.at === "" ? "" : `, at '${issue.at}'`}: ${issue.reason}; fix the file (keys are the long option names in camelCase, plus "files")`;
  }
}

const gib = (bytes: number): string => `${(bytes / 2 ** 30).toFixed(2)} GiB`;

/** A refused option, as a usage message: "option '--weight' argument '1.3' is invalid: must be ...". */
export function describeOptionIssue(issue: OptionIssue): string {
  if (issue.option === "") return `the options are invalid: ${issue.message}`;
  const argument = issue.value === undefined ? "" : ` argument '${issue.value}'`;
  return `option '${flagOf(issue.option)}'${argument} is invalid: ${issue.message}`;
}

/** Why a file read by position could not be read whole: it became shorter after it was opened. */
export const SHRANK_REASON = "the file became shorter while it was read";

/** A short reason from a Node.js file-system error code. */
export function fileErrorReason(error: unknown): string {
  const code = typeof error === "object" && error !== null && "code" in error ? String(error.code) : "";
  const reasons: Record<string, string> = {
    ENOENT: "no such file or directory",
    EACCES: "permission denied",
    EPERM: "operation not permitted",
    EISDIR: "it is a directory",
    ENOTDIR: "a part of the path is not a directory",
    EROFS: "read-only file system",
    ENOSPC: "no space left on the device",
    EMFILE: "too many open files",
    EIO: "an input/output error of the device",
    EDQUOT: "the disk quota is exceeded",
    EFBIG: "the file is too large for the file system",
    EPIPE: "the reader closed the pipe",
  };
  return reasons[code] ?? (error instanceof Error ? error.message : String(error));
}
