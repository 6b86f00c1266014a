/**
 * Loads the bundled CLI (dist/cli-bundle.cjs) through V8's code cache (dist/cli-bundle.cache).
 *
 * Compiling the bundle is most of the CLI's start-up; the cache holds the bytecode of the functions a
 * typical run executes, written once at build time (scripts/build.mjs runs the bundle on the bundled
 * examples, then serialises it). The cache file starts with the SHA-256 of the bundle's bytes it was
 * made from; every load hashes the bundle it is about to compile (about 0.3 ms) and uses the cache only
 * when the two agree, so a cache is never applied to a bundle whose text changed, even with the
 * length kept (V8 itself checks only the source's length, its own version and flags). A missing,
 * stale or rejected cache only costs time: the bundle is then compiled from source.
 */
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { Script } from "node:vm";

/** What the bundle exports (src/cli/runtime/main.ts). */
export type CliBundle = typeof import("./main.js");

export interface LoadedBundle {
  readonly bundle: CliBundle;
  /** The compiled script, for writing a fresh cache (`createCachedData`). */
  readonly script: Script;
  /** "used", or why not: no cache file, made from another bundle, or rejected by V8. */
  readonly cache: "used" | "absent" | "stale" | "rejected";
}

export const bundleFile = "cli-bundle.cjs";
export const cacheFile = "cli-bundle.cache";

/** The identity of a bundle: the SHA-256 of its bytes, in hex. */
export function bundleId(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

/** The cache file's contents: the identity of the bundle it was made from, a newline, V8's data. */
export function cacheContents(bundleBytes: Uint8Array, data: Uint8Array): Buffer {
  return Buffer.concat([Buffer.from(`${bundleId(bundleBytes)}\n`), data]);
}

function readCache(path: string, bundleBytes: Uint8Array): Buffer | "absent" | "stale" {
  let contents: Buffer;
  try {
    contents = readFileSync(path);
  } catch {
    return "absent";
  }
  const header = Buffer.from(`${bundleId(bundleBytes)}\n`);
  if (contents.length <= header.length || !contents.subarray(0, header.length).equals(header)) return "stale";
  return contents.subarray(header.length);
}

/** Compiles and evaluates the bundle in `dir` (with its cache unless `useCache` is false). */
export function loadCliBundle(dir: string, useCache = true): LoadedBundle {
  const path = join(dir, bundleFile);
  const bytes = readFileSync(path);
  const source = bytes.toString("utf8");
  const cached = useCache ? readCache(join(dir, cacheFile), bytes) : "absent";
  // The same wrapper as Node's own CommonJS loader, plus the bundle's URL (its import.meta.url).
  const script = new Script(`(function (exports, require, module, __filename, __dirname, __bundleUrl) {${source}\n})`, {
    filename: path,
    ...(typeof cached === "string" ? {} : { cachedData: cached }),
  });
  const cache = typeof cached === "string" ? cached : script.cachedDataRejected === true ? "rejected" : "used";
  const module = { exports: {} as CliBundle };
  const wrapper = script.runInThisContext() as (...args: unknown[]) => void;
  wrapper(module.exports, createRequire(path), module, path, dir, pathToFileURL(path).href);
  return { bundle: module.exports, script, cache };
}
