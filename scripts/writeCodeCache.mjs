// Writes dist/cli-bundle.cache (see src/cli/runtime/bundleLoader.ts): loads the freshly built bundle without a
// cache, runs the commands below in process with their output discarded, then saves V8's code cache
// of the bundle, which now holds the bytecode of every function those runs executed (the rest is
// compiled on first use). Run by scripts/build.mjs in a process of its own with node's default flags
// (V8 rejects a cache made under other flags).
import { readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { bundleFile, cacheContents, cacheFile, loadCliBundle } from "../dist/bundleLoader.js";

const dist = new URL("../dist/", import.meta.url).pathname;
process.chdir(new URL("..", import.meta.url).pathname);
const monthly = ["examples/harbourline-monthly.csv", "--low", "Stillwater Low Vol", "--high", "Kestrel High Beta", "--rf", "0.002"];
const daily = ["examples/harbourline-daily.csv", "--low", "Stillwater Low Vol", "--high", "Kestrel High Beta"];
// Only solve: a cache holding every command's functions is larger, and loading it costs the
// common run more (about 5 ms) than compiling another command's functions on first use does.
// The third file holds full-precision numbers (17 digits and more: the reader's other path), made here.
const fullPrecision = "full-precision.csv";
const portfolios = "portfolios.csv";
const runs = [
  ["solve", ...monthly],
  ["solve", ...daily, "--format", "json", "--no-uncertainty"],
  ["solve", fullPrecision, "--low", "low", "--high", "high", "--format", "json", "--no-uncertainty"],
  ["solve", portfolios, "--low", "P1", "--high", "P4", "--portfolios", "P1,P2,P3,P4", "--format", "json"],
  // A batch: the file read once for its pairs (input/readBatch.ts) and JSON Lines.
  ["solve", portfolios, "--lows", "P1,P2", "--highs", "P3,P4", "--format", "jsonl"],
];
const day = 86_400_000;
const fullPrecisionText = [
  "date,low,high",
  ...Array.from({ length: 300 }, (_, i) => {
    const factor = Math.sin(i * 1.3) / 100;
    return `${new Date(Date.UTC(2001, 0, 1) + i * day).toISOString().slice(0, 10)},${0.7 * factor + Math.cos(i) / 400},${1.3 * factor - Math.cos(i * 0.7) / 300}`;
  }),
  "",
].join("\n");

// Four portfolios on one factor, for the factor model's functions.
const portfoliosText = [
  "date,P1,P2,P3,P4",
  ...Array.from({ length: 300 }, (_, i) => {
    const factor = Math.sin(i * 0.9) / 100;
    const noise = (k) => Math.cos(i * (1.7 + k)) / 500;
    return `${new Date(Date.UTC(2001, 0, 1) + i * day).toISOString().slice(0, 10)},${[0.6, 0.9, 1.2, 1.5].map((b, k) => (b * factor + noise(k)).toFixed(6)).join(",")}`;
  }),
  "",
].join("\n");

const { bundle, script } = loadCliBundle(dist, false);
const discard = () => undefined;
const processIo = bundle.processIo({ loadVega: () => import("vega") });
const fullPrecisionBytes = Buffer.from(fullPrecisionText);
const portfoliosBytes = Buffer.from(portfoliosText);
// As a job's source it is read by position, as large files are (through a window: input/engines/byteWindow.ts).
const paged = (bytes) => ({
  size: bytes.length,
  read: (position, target, offset, length) => bytes.copy(target, offset, position, position + length),
  close: () => undefined,
});
const io = {
  ...processIo,
  readInput: (path) =>
    path === fullPrecision
      ? Promise.resolve({ ok: true, value: fullPrecisionBytes })
      : path === portfolios
        ? Promise.resolve({ ok: true, value: portfoliosBytes })
        : processIo.readInput(path),
  readSource: (path) =>
    path === fullPrecision
      ? Promise.resolve({ ok: true, value: paged(fullPrecisionBytes) })
      : path === portfolios
        ? Promise.resolve({ ok: true, value: paged(portfoliosBytes) })
        : processIo.readSource(path),
  writeOut: discard,
  writeErr: discard,
  // Reports go nowhere: an output target that takes everything and commits nothing.
  openOutput: () => ({
    ok: true,
    value: { write: () => Promise.resolve(), commit: () => Promise.resolve({ ok: true, value: undefined }), abort: discard },
  }),
  stdoutIsTerminal: false,
  stderrIsTerminal: false,
};
for (const argv of runs) {
  const code = await bundle.run(argv, io);
  if (code !== 0) throw new Error(`code cache warm-up: betabound ${argv.join(" ")} exited with ${code}`);
}
writeFileSync(join(dist, cacheFile), cacheContents(readFileSync(join(dist, bundleFile)), script.createCachedData()));
