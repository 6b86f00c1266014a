/**
 * Where a job's files come from: a function from a file name to its bytes, or a failure with a stable
 * code and its message. The CLI reads the file system and standard input ("-"); a library caller may
 * hand in files held in memory with `sourcesFrom`.
 */
import { failure, type Result, success } from "../core/result.js";

/** Why a file could not be read: a stable code and the message. */
export interface SourceFailure {
  readonly code: string;
  readonly message: string;
}

export type ReadSource = (name: string) => Promise<Result<Uint8Array, SourceFailure>>;

/** A reader of files held in memory, by name; text is encoded as UTF-8. */
export function sourcesFrom(files: Readonly<Record<string, string | Uint8Array>>): ReadSource {
  return async (name) => {
    const file = files[name];
    if (file === undefined) return failure({ code: "read-failed", message: `cannot read '${name}': no such file was given` });
    return success(typeof file === "string" ? new TextEncoder().encode(file) : file);
  };
}

/** The name a report shows for a file: "<stdin>" for standard input ("-"). */
export const sourceName = (file: string): string => (file === "-" ? "<stdin>" : file);
