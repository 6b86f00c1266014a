/**
 * The CLI's reading of files and standard input, and what a path names (for refusing an output that
 * would land on an input). Writing is output.ts.
 */
import { closeSync, createReadStream, fstatSync, openSync, readFileSync, readSync, statSync } from "node:fs";
import { failure, success, type Result } from "../../core/result.js";
import { largeInputBuffer, maximumInputBytes, readsThroughWindow } from "../../input/index.js";
import type { PagedFile } from "../../jobs/index.js";
import { type CliIssue, describeCliIssue, fileErrorReason, SHRANK_REASON } from "../messages.js";
import { resolveTarget } from "./output.js";

/** Reads a whole file, or standard input for "-"; refuses either beyond `maximumInputBytes`. */
export async function readInputBytes(path: string, limit = maximumInputBytes): Promise<Result<Uint8Array, CliIssue>> {
  const name = path === "-" ? "<stdin>" : path;
  try {
    if (path === "-") return await readStream(process.stdin, limit, name);
    // One synchronous read: for a large file this is much faster than the chunked asynchronous read,
    // and the CLI has nothing else to do meanwhile.
    const stats = statSync(path);
    // A device or FIFO (/dev/stdin, a named pipe, /dev/zero) has no size to check: it is read as a
    // stream, as standard input is, so that the limit holds and a signal is heard meanwhile.
    if (!stats.isFile()) return await readStream(createReadStream(path), limit, name);
    const size = stats.size;
    if (size > limit) return failure({ code: "input-too-large", path: name, size, limit });
    // A large file is read straight into the memory the reader works in (src/input/engines/rowKernel.ts).
    const target = largeInputBuffer(size);
    const bytes = target === null ? readFileSync(path) : readInto(path, target);
    return bytes.length > limit ? failure({ code: "input-too-large", path: name, size: bytes.length, limit }) : success(bytes);
  } catch (error) {
    return failure({ code: "read-failed", path: name, reason: fileErrorReason(error) });
  }
}

/**
 * An input for a job: a large regular file is opened to be read by position through a window (the
 * input layer reads it so, or whole when it must: see input/engines/byteWindow.ts), closed by the
 * job; anything else is read whole as `readInputBytes` reads it.
 */
export async function readInputSource(path: string, limit = maximumInputBytes): Promise<Result<Uint8Array | PagedFile, CliIssue>> {
  if (path === "-") return readInputBytes(path, limit);
  let fd: number;
  try {
    fd = openSync(path, "r");
  } catch {
    return readInputBytes(path, limit);
  }
  let paged = false;
  try {
    const stats = fstatSync(fd);
    if (!stats.isFile() || stats.size > limit || !readsThroughWindow(stats.size)) return await readInputBytes(path, limit);
    paged = true;
    const size = stats.size;
    // A read that fails is reported by the job (see PagedFile.failure), not by the reader it failed.
    let failed: CliIssue | null = null;
    const read = (position: number, target: Uint8Array, offset: number, length: number): number => {
      try {
        const count = readSync(fd, target, offset, length, position);
        if (count === 0 && length > 0 && position < size) failed ??= { code: "read-failed", path, reason: SHRANK_REASON };
        return count;
      } catch (error) {
        failed ??= { code: "read-failed", path, reason: fileErrorReason(error) };
        return 0;
      }
    };
    const failure = () => (failed === null ? null : { code: failed.code, message: describeCliIssue(failed) });
    return success({ size, read, close: () => closeSync(fd), failure });
  } catch (error) {
    return failure({ code: "read-failed", path, reason: fileErrorReason(error) });
  } finally {
    if (!paged) closeSync(fd);
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

/**
 * Standard input (or a device, a FIFO) whole, stopping (and refusing) as soon as it passes `limit`
 * bytes. A NUL byte ends the reading early: no CSV holds one, and the reader refuses the bytes up to
 * it with the line and column (a binary stream, /dev/zero, is not read for gigabytes first).
 */
export async function readStream(stream: NodeJS.ReadableStream, limit: number, name: string): Promise<Result<Uint8Array, CliIssue>> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of stream) {
    const bytes = typeof chunk === "string" ? Buffer.from(chunk) : chunk;
    size += bytes.length;
    if (size > limit) return failure({ code: "input-too-large", path: name, size: null, limit });
    chunks.push(bytes);
    if (bytes.includes(0)) break;
  }
  return success(Buffer.concat(chunks, size));
}

/** What `path` names: see CliIo.identify. */
export function identify(path: string): { key: string; device: boolean } {
  try {
    const stats = path === "-" ? fstatSync(0) : statSync(path);
    return { key: `inode ${stats.dev}:${stats.ino}`, device: stats.isCharacterDevice() };
  } catch {
    return { key: `path ${resolveTarget(path).path}`, device: false };
  }
}
