/**
 * Where a job's files come from: a function from a file name to its bytes (or, for a large file, a
 * way to read it by position: see PagedBytes), or a failure with a stable code and its message. The
 * CLI reads the file system and standard input ("-"); a library caller may hand in files held in
 * memory with `sourcesFrom`.
 */
import { failure, type Result, success } from "../core/result.js";
import type { PagedBytes } from "../input/index.js";

/** Why a file could not be read: a stable code and the message. */
export interface SourceFailure {
  readonly code: string;
  readonly message: string;
}

/**
 * A file read by position, open until `close`; `failure`, when given, says why a read returned fewer
 * bytes than asked (the job then reports that instead of what reading the file gave). Both are
 * functions of their own: they are called apart from the object.
 */
export interface PagedFile extends PagedBytes {
  readonly close: () => void;
  readonly failure?: () => SourceFailure | null;
}

export type ReadSource = (name: string) => Promise<Result<Uint8Array | PagedFile, SourceFailure>>;

/**
 * What closes a file once read (nothing for bytes in memory), at most once however often it is
 * called; it holds no reference to the file's reader, so that what was read through it can be let go.
 */
export function closerOf(file: Uint8Array | PagedFile): () => void {
  if (file instanceof Uint8Array) return () => {};
  let close: (() => void) | null = file.close;
  return () => {
    close?.();
    close = null;
  };
}

/** Why reading a file failed meanwhile, or null (always null for bytes in memory); it holds no reference to the file's reader. */
export function failureOf(file: Uint8Array | PagedFile): () => SourceFailure | null {
  return file instanceof Uint8Array || file.failure === undefined ? () => null : file.failure;
}

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
