// Writes dist/cli-bundle.cache (see src/cli/bundleLoader.ts): loads the freshly built bundle without a
// cache, runs the commands below in process with their output discarded, then saves V8's code cache
// of the bundle, which now holds the bytecode of every function those runs executed (the rest is
// compiled on first use). Run by
// scripts/build.mjs in a process of its own with node's default flags (V8 rejects a cache made under
// other flags).
import { writeFileSync } from "node:fs";
import { join } from "node:path";
import { cacheContents, cacheFile, loadCliBundle } from "../dist/bundleLoader.js";

const dist = new URL("../dist/", import.meta.url).pathname;
process.chdir(new URL("..", import.meta.url).pathname);
const monthly = ["examples/harbourline-monthly.csv", "--low", "Stillwater Low Vol", "--high", "Kestrel High Beta", "--rf", "0.002"];
const daily = ["examples/harbourline-daily.csv", "--low", "Stillwater Low Vol", "--high", "Kestrel High Beta"];
// Only solve: a cache holding every command's functions is larger, and loading it costs the
// common run more (about 5 ms) than compiling another command's functions on first use does.
const runs = [
  ["solve", ...monthly],
  ["solve", ...daily, "--format", "json", "--no-uncertainty"],
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
