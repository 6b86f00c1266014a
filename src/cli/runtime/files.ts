/**
 * The CLI's file access. Output is always written to a temporary file in the target's folder and
 * renamed over the target, so a failed or interrupted run never leaves a partial file and never
 * damages the previous one.
 */
import { closeSync, openSync, readFileSync, readSync, renameSync, statSync, unlinkSync, writeFileSync, writeSync } from "node:fs";
import { basename, dirname, join } from "node:path";
import { failure, success, type Result } from "../../core/result.js";
import { largeInputBuffer } from "../../input/index.js";
import type { OutputSink } from "./io.js";
import { fileErrorReason, type CliIssue } from "../messages.js";

/** Reads a whole file, or standard input for "-". */
export async function readInputBytes(path: string): Promise<Result<Uint8Array, CliIssue>> {
  try {
    if (path === "-") return success(await readStream(process.stdin));
    // One synchronous read: for a large file this is much faster than the chunked asynchronous read,
    // and the CLI has nothing else to do meanwhile.
    const size = statSync(path).size;
    // A large file is read straight into the memory the reader works in (src/input/engines/rowKernel.ts).
    const target = largeInputBuffer(size);
    return success(target === null ? readFileSync(path) : readInto(path, target));
  } catch (error) {
    return failure({ code: "read-failed", path: path === "-" ? "<stdin>" : path, reason: fileErrorReason(error) });
  }
}

/** Reads the file into `bytes` (its size when statted): the bytes read, fewer if it shrank meanwhile. */
function readInto(path: string, bytes: Uint8Array): Uint8Array {
  const fd = openSync(path, "r");
  try {
    let length = 0;
    while (length < bytes.length) {
      const read = readSync(fd, bytes, length, bytes.length - length, null);
      if (read === 0) break;
      length += read;
    }
    // A file that grew after the stat is read again whole, in plain memory.
    if (length === bytes.length && readSync(fd, new Uint8Array(1), 0, 1, null) > 0) return readFileSync(path);
    return length === bytes.length ? bytes : bytes.subarray(0, length);
  } finally {
    closeSync(fd);
  }
}

async function readStream(stream: NodeJS.ReadableStream): Promise<Uint8Array> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(typeof chunk === "string" ? Buffer.from(chunk) : chunk);
  return Buffer.concat(chunks);
}

let temporaries = 0;

/**
 * A name no other writer uses: the process id and a counter make it unique on this host, the random
 * part across hosts sharing a folder; files are created exclusively ("wx"), so a clash fails rather
 * than overwrites.
 */
function temporaryName(path: string): string {
  temporaries += 1;
  const random = Math.floor(Math.random() * 0x1_0000_0000)
    .toString(16)
    .padStart(8, "0");
  return join(dirname(path), `.${basename(path)}.betabound-${process.pid}-${temporaries}-${random}.tmp`);
}

/** A sink for long outputs: chunks go to stdout, or to a temporary file renamed over `path` on close. */
export function openSink(path: string | undefined): Result<OutputSink, CliIssue> {
  if (path === undefined) {
    return success({ write: (text) => void process.stdout.write(text), close: () => success(undefined), discard: () => undefined });
  }
  const temporary = temporaryName(path);
  let fd: number;
  try {
    fd = openSync(temporary, "wx");
  } catch (error) {
    return failure({ code: "write-failed", path, reason: fileErrorReason(error) });
  }
  let failed: unknown = null;
  const remove = (): void => {
    try {
      closeSync(fd);
    } catch {
      // already closed
    }
    try {
      unlinkSync(temporary);
    } catch {
      // already gone
    }
  };
  return success({
    write(text) {
      if (failed !== null) return;
      try {
        writeSync(fd, text);
      } catch (error) {
        failed = error;
      }
    },
    close() {
      if (failed !== null) {
        remove();
        return failure({ code: "write-failed", path, reason: fileErrorReason(failed) });
      }
      try {
        closeSync(fd);
        renameSync(temporary, path);
        return success(undefined);
      } catch (error) {
        remove();
        return failure({ code: "write-failed", path, reason: fileErrorReason(error) });
      }
    },
    discard: remove,
  });
}

/**
 * Writes `text` to `path` atomically (temporary file + rename). Synchronous inside, like the reads:
 * the CLI has nothing else to do meanwhile (and node:fs/promises costs start-up time to load).
 */
export async function writeFileAtomic(path: string, text: string): Promise<Result<void, CliIssue>> {
  const temporary = temporaryName(path);
  try {
    writeFileSync(temporary, text, { flag: "wx" });
    renameSync(temporary, path);
    return success(undefined);
  } catch (error) {
    try {
      unlinkSync(temporary);
    } catch {
      // never created, or already gone
    }
    return failure({ code: "write-failed", path, reason: fileErrorReason(error) });
  }
}
