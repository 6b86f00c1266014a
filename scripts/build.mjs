// Builds dist/: the CLI as one bundled file (fast start-up: one file to load, dependencies inlined),
// the library as an ES module with its dependencies left external, and the type declarations.
import { build } from "esbuild";
import { execFileSync } from "node:child_process";
import { chmodSync, readFileSync, rmSync } from "node:fs";
import { createRequire } from "node:module";

const require = createRequire(import.meta.url);
const pkg = JSON.parse(readFileSync(new URL("../package.json", import.meta.url), "utf8"));
const define = { __BETABOUND_VERSION__: JSON.stringify(pkg.version) };

rmSync("dist", { recursive: true, force: true });

// commander loads node:child_process when it is imported, only to run stand-alone executable
// subcommands, which betabound has none of; loading it on first use saves that time on every run.
const lazyChildProcess = {
  name: "lazy-child-process",
  setup(b) {
    b.onResolve({ filter: /^node:child_process$/ }, (args) =>
      args.importer.includes("node_modules/commander/") ? { path: "lazy-child-process", namespace: "lazy" } : undefined,
    );
    b.onLoad({ filter: /.*/, namespace: "lazy" }, () => ({
      contents: 'module.exports = new Proxy({}, { get: (_, key) => require("node:child_process")[key] });',
      loader: "js",
    }));
  },
};

// The CLI: the program bundled into one CommonJS file (dependencies inlined), loaded by a small
// launcher through V8's code cache (src/cli/runtime/bundleLoader.ts); CommonJS because only a classic script
// can be compiled with a cache on Node 20.
await build({
  entryPoints: ["src/cli/runtime/main.ts"],
  outfile: "dist/cli-bundle.cjs",
  bundle: true,
  platform: "node",
  format: "cjs",
  target: "node20",
  // import.meta.url of the bundled modules is the bundle's own URL, passed in by the loader.
  define: { ...define, "import.meta.url": "__bundleUrl" },
  // vega is loaded only when a chart is drawn (a dynamic import); leaving it out of the bundle keeps
  // start-up fast. It is a dependency, so it is there at run time.
  external: ["vega"],
  plugins: [lazyChildProcess],
  // Minified: smaller to read, compile and cache.
  minify: process.env.BETABOUND_NO_MINIFY !== "1",
  logLevel: "warning",
});

// The executable, and the loader on its own for writing the cache below.
await build({
  entryPoints: ["src/cli/runtime/launcher.ts"],
  outfile: "dist/cli.cjs",
  bundle: true,
  platform: "node",
  format: "cjs",
  target: "node20",
  packages: "external",
  banner: { js: "#!/usr/bin/env node" },
  logLevel: "warning",
});
chmodSync("dist/cli.cjs", 0o755);
await build({
  entryPoints: ["src/cli/runtime/bundleLoader.ts"],
  outfile: "dist/bundleLoader.js",
  bundle: true,
  platform: "node",
  format: "esm",
  target: "node20",
  packages: "external",
  logLevel: "warning",
});

// The worker threads of the bootstrap, of roll's CSV and of readying fresh memory, loaded by dist/cli.cjs from its own folder.
for (const name of ["bootstrapWorker", "rollCsvWorker", "pretouchWorker"])
  await build({
    entryPoints: [`src/cli/runtime/${name}.ts`],
    outfile: `dist/${name}.js`,
    bundle: true,
    platform: "node",
    format: "esm",
    target: "node20",
    logLevel: "warning",
  });

// The library: everything (jobs, options, renderers, core), and the pure core alone (no package).
for (const [entry, outfile] of [
  ["src/index.ts", "dist/index.js"],
  ["src/core/index.ts", "dist/core.js"],
]) {
  await build({
    entryPoints: [entry],
    outfile,
    bundle: true,
    platform: "node",
    format: "esm",
    target: "node20",
    define,
    packages: "external",
    logLevel: "warning",
  });
}

execFileSync(process.execPath, [require.resolve("typescript/bin/tsc"), "-p", "tsconfig.build.json"], {
  stdio: "inherit",
});

// The code cache: run the bundle in this process on the bundled examples, quietly, so that the
// functions a typical run uses are compiled, then serialise their bytecode.
execFileSync(process.execPath, ["scripts/writeCodeCache.mjs"], { stdio: "inherit" });
