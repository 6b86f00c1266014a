/**
 * End-to-end: the executable loads its bundle through V8's code cache (src/cli/runtime/bundleLoader.ts), and
 * runs the same without it: with the cache missing, made from another bundle, or unusable.
 */
import { execFileSync, spawnSync } from "node:child_process";
import { createHash } from "node:crypto";
import { copyFileSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";

const root = new URL("../../", import.meta.url).pathname;
const dist = join(root, "dist");
const monthly = join(root, "examples/harbourline-monthly.csv");
const args = ["solve", monthly, "--low", "Stillwater Low Vol", "--high", "Kestrel High Beta", "--format", "json"];

interface Loader {
  loadCliBundle(dir: string): { cache: string };
}
const loader = (await import(join(dist, "bundleLoader.js"))) as Loader;

function run(dir: string) {
  const result = spawnSync(process.execPath, [join(dir, "cli.cjs"), ...args], { encoding: "utf8" });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

/** A copy of the executable in a scratch folder, with `cache` as its code cache (none when null). */
function copyWith(cache: Buffer | null, bundle?: Buffer): string {
  const dir = mkdtempSync(join(tmpdir(), "betabound-cache-"));
  for (const file of ["cli.cjs", "cli-bundle.cjs"]) copyFileSync(join(dist, file), join(dir, file));
  if (bundle !== undefined) writeFileSync(join(dir, "cli-bundle.cjs"), bundle);
  if (cache !== null) writeFileSync(join(dir, "cli-bundle.cache"), cache);
  return dir;
}

describe("the code cache", () => {
  const built = readFileSync(join(dist, "cli-bundle.cache"));
  const header = built.subarray(0, built.indexOf(10) + 1);
  const expected = run(dist);

  it("is written by the build and accepted by V8", () => {
    expect(loader.loadCliBundle(dist).cache).toBe("used");
    expect(expected.code).toBe(0);
  });

  it.each([
    ["absent", null],
    ["stale", Buffer.concat([Buffer.from(`${"0".repeat(header.length - 1)}\n`), built.subarray(header.length)])],
    ["rejected", Buffer.concat([header, Buffer.from("not a code cache")])],
  ])("is %s: the bundle is compiled from source, with the same output", (state, cache) => {
    const dir = copyWith(cache);
    expect(loader.loadCliBundle(dir).cache).toBe(state);
    const result = run(dir);
    expect(result.code).toBe(0);
    expect(result.stderr).toBe(expected.stderr);
    expect(result.stdout).toBe(expected.stdout);
  });

  it("is stale for a bundle whose text changed with its length kept: the changed text is what runs", () => {
    // The cache header is the SHA-256 of the bundle's bytes (computed independently here with node:crypto).
    expect(header.toString().trim()).toBe(
      createHash("sha256")
        .update(readFileSync(join(dist, "cli-bundle.cjs")))
        .digest("hex"),
    );
    const original = readFileSync(join(dist, "cli-bundle.cjs"), "latin1");
    const marker = "structural betas of a low-beta and a high-beta book";
    expect(original).toContain(marker);
    const tampered = Buffer.from(original.replace(marker, marker.toUpperCase()), "latin1");
    expect(tampered.length).toBe(Buffer.byteLength(original, "latin1"));
    const dir = copyWith(built, tampered);
    expect(loader.loadCliBundle(dir).cache).toBe("stale");
    const result = spawnSync(process.execPath, [join(dir, "cli.cjs"), ...args.slice(0, -2)], { encoding: "utf8" });
    expect(result.status).toBe(0);
    expect(result.stdout).toContain(marker.toUpperCase());
    expect(result.stdout).not.toContain(marker);
  });
});

describe("the published package", () => {
  it("holds the executable, its bundle, the code cache and the workers (npm pack)", () => {
    const npm = process.platform === "win32" ? "npm.cmd" : "npm";
    const packed = JSON.parse(execFileSync(npm, ["pack", "--dry-run", "--json", "--ignore-scripts"], { cwd: root, encoding: "utf8" })) as {
      files: { path: string }[];
    }[];
    const files = new Set(packed[0]?.files.map((f) => f.path));
    const pkg = JSON.parse(readFileSync(join(root, "package.json"), "utf8")) as { bin: Record<string, string> };
    for (const path of [
      pkg.bin.betabound?.replace(/^\.\//, ""),
      "dist/cli-bundle.cjs",
      "dist/cli-bundle.cache",
      "dist/bootstrapWorker.js",
      "dist/rollCsvWorker.js",
      "dist/pretouchWorker.js",
      "dist/index.js",
    ]) {
      expect(files.has(path ?? ""), path).toBe(true);
    }
  });
});
