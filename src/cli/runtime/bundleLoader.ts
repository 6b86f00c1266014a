/**
 * Loads the bundled CLI (dist/cli-bundle.cjs) through V8's code cache (dist/cli-bundle.cache).
 *
 * Compiling the bundle is most of the CLI's start-up; the cache holds the bytecode of the functions a
 * typical run executes, written once at build time (scripts/build.mjs runs the bundle on the bundled
 * examples, then serialises it). The cache file starts with the identity of the bundle it was made
 * from (a hash written into this loader by the build), so a stale cache is never used; V8 itself
 * rejects a cache from another V8 version or flag set. A missing, stale or rejected cache only costs
 * time: the bundle is then compiled from source.
 */
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

/** Replaced by the build with a hash of the bundle's text. */
declare const __BETABOUND_BUNDLE_ID__: string;
export const bundleId: string = __BETABOUND_BUNDLE_ID__;

/** The cache file's contents: the bundle's identity, a newline, V8's data. */
export function cacheContents(data: Uint8Array): Buffer {
  return Buffer.concat([Buffer.from(`${bundleId}\n`), data]);
}

function readCache(path: string): Buffer | "absent" | "stale" {
  let contents: Buffer;
  try {
    contents = readFileSync(path);
  } catch {
    return "absent";
  }
  const header = Buffer.from(`${bundleId}\n`);
  if (contents.length <= header.length || !contents.subarray(0, header.length).equals(header)) return "stale";
  return contents.subarray(header.length);
}

/** Compiles and evaluates the bundle in `dir` (with its cache unless `useCache` is false). */
export function loadCliBundle(dir: string, useCache = true): LoadedBundle {
  const path = join(dir, bundleFile);
  const source = readFileSync(path, "utf8");
  const cached = useCache ? readCache(join(dir, cacheFile)) : "absent";
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
