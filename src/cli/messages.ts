/**
 * Failures the CLI itself detects (reading and writing files, option values), as typed values with
 * stable codes. All of their wording is here.
 */
import { flagOf, type OptionIssue } from "../options/index.js";

export type CliIssue =
  | { readonly code: "no-input" }
  | { readonly code: "read-failed"; readonly path: string; readonly reason: string }
  | { readonly code: "write-failed"; readonly path: string; readonly reason: string }
  | { readonly code: "invalid-config"; readonly path: string; readonly at: string; readonly reason: string };

export function describeCliIssue(issue: CliIssue): string {
  switch (issue.code) {
    case "no-input":
      return "no input: give a CSV file path, or '-' and pipe the data on standard input";
    case "read-failed":
      return `cannot read '${issue.path}': ${issue.reason}; check the path and its permissions`;
    case "write-failed":
      return `cannot write '${issue.path}': ${issue.reason}; nothing was written and any existing file is unchanged`;
    case "invalid-config":
      return `config file '${issue.path}'${issue.at === "" ? "" : `, at '${issue.at}'`}: ${issue.reason}; fix the file (keys are the long option names in camelCase, plus "files")`;
  }
}

/** A refused option, as a usage message: "option '--weight' argument '1.3' is invalid: must be ...". */
export function describeOptionIssue(issue: OptionIssue): string {
  if (issue.option === "") return `the options are invalid: ${issue.message}`;
  const argument = issue.value === undefined ? "" : ` argument '${issue.value}'`;
  return `option '${flagOf(issue.option)}'${argument} is invalid: ${issue.message}`;
}

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
  };
  return reasons[code] ?? (error instanceof Error ? error.message : String(error));
}
