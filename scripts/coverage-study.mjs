// Bundles scripts/coverage-study.ts with esbuild (a dev dependency) and runs it, passing arguments on:
//   node scripts/coverage-study.mjs [--quick] [--reps 1000] [--n 2520] [--bootstrap 399]
// Equivalent to:
//   npx esbuild scripts/coverage-study.ts --bundle --platform=node --format=esm --outfile=/tmp/coverage.mjs && node /tmp/coverage.mjs
import { build } from "esbuild";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { pathToFileURL, fileURLToPath } from "node:url";

const entry = fileURLToPath(new URL("./coverage-study.ts", import.meta.url));
const outfile = join(tmpdir(), `betabound-coverage-${process.pid}.mjs`);
await build({ entryPoints: [entry], bundle: true, platform: "node", format: "esm", outfile, logLevel: "warning" });
await import(pathToFileURL(outfile).href);
