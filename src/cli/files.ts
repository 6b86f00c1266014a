/**
 * The CLI's file access. Output is always written to a temporary file in the target's folder and
 * renamed over the target, so a failed or interrupted run never leaves a partial file and never
 * damages the previous one.
 */
import { randomBytes } from "node:crypto";
import { readFile, rename, unlink, writeFile } from "node:fs/promises";
import { basename, dirname, join } from "node:path";
import { failure, success, type Result } from "../core/result.js";
import { fileErrorReason, type CliIssue } from "./messages.js";

/** Reads a whole file, or standard input for "-". */
export async function readInputBytes(path: string): Promise<Result<Uint8Array, CliIssue>> {
  try {
    const bytes = path === "-" ? await readStream(process.stdin) : await readFile(path);
    return success(bytes);
  } catch (error) {
    return failure({ code: "read-failed", path: path === "-" ? "<stdin>" : path, reason: fileErrorReason(error) });
  }
}

async function readStream(stream: NodeJS.ReadableStream): Promise<Uint8Array> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(typeof chunk === "string" ? Buffer.from(chunk) : chunk);
  return Buffer.concat(chunks);
}

/** Writes `text` to `path` atomically (temporary file + rename). */
export async function writeFileAtomic(path: string, text: string): Promise<Result<void, CliIssue>> {
  const temporary = join(dirname(path), `.${basename(path)}.betabound-${process.pid}-${randomBytes(4).toString("hex")}.tmp`);
  try {
    await writeFile(temporary, text, { flag: "wx" });
    await rename(temporary, path);
    return success(undefined);
  } catch (error) {
    await unlink(temporary).catch(() => undefined);
    return failure({ code: "write-failed", path, reason: fileErrorReason(error) });
  }
}
