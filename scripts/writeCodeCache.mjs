// Writes dist/cli-bundle.cache (see src/cli/bundleLoader.ts): loads the freshly built bundle without a
// cache, runs the commands below in process with their output discarded, then saves V8's code cache
// of the bundle, which now holds the bytecode of every function those runs executed. Run by
// scripts/build.mjs in a process of its own with node's default flags (V8 rejects a cache made under
// other flags).
import { writeFileSync } from "node:fs";
import { join } from "node:path";
import { cacheContents, cacheFile, loadCliBundle } from "../dist/bundleLoader.js";

const dist = new URL("../dist/", import.meta.url).pathname;
process.chdir(new URL("..", import.meta.url).pathname);
const monthly = ["examples/harbourline-monthly.csv", "--low", "Stillwater Low Vol", "--high", "Kestrel High Beta", "--rf", "0.002"];
const daily = ["examples/harbourline-daily.csv", "--low", "Stillwater Low Vol", "--high", "Kestrel High Beta"];
const runs = [
  ["solve", ...monthly],
  ["solve", ...daily, "--format", "json"],
  ["solve", ...daily, "--format", "json", "--no-uncertainty"],
  ["solve", ...monthly, "--format", "csv"],
  ["roll", ...daily, "--window", "252", "--step", "21", "--format", "csv"],
  ["roll", ...daily, "--window", "252", "--step", "63", "--format", "jsonl"],
  ["implied", "--low-beta", "0.8", "--factor-vol", "0.04", "--factor-mean", "0.005", "--low-noise-vol", "0.01", "--high-noise-vol", "0.02"],
  ["simulate", "--low-beta", "0.8", "--factor-vol", "0.04", "--factor-mean", "0.005", "--low-noise-vol", "0.01", "--high-noise-vol", "0.02", "--periods", "120"],
  ["solve", "--help"],
];

const { bundle, script } = loadCliBundle(dist, false);
const discard = () => undefined;
const quietSink = { write: discard, close: () => ({ ok: true, value: undefined }), discard };
const io = {
  ...bundle.processIo(),
  writeOut: discard,
  writeErr: discard,
  openSink: () => ({ ok: true, value: quietSink }),
  stdoutIsTerminal: false,
  stderrIsTerminal: false,
};
for (const argv of runs) {
  const code = await bundle.run(argv, io);
  if (code !== 0) throw new Error(`code cache warm-up: betabound ${argv.join(" ")} exited with ${code}`);
}
writeFileSync(join(dist, cacheFile), cacheContents(script.createCachedData()));
