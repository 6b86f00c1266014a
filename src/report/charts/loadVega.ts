/**
 * Loads vega on first use. The CLI bundle runs as a classic script compiled with V8's code cache
 * (src/cli/runtime/bundleLoader.ts), where `import()` cannot be used; its loader hands in an importer of its
 * own with `setVegaImporter`. Everywhere else (the library, tests) the plain dynamic import is used.
 */
type VegaModule = typeof import("vega");

let importVega: () => Promise<VegaModule> = () => import("vega");

export function setVegaImporter(importer: () => Promise<unknown>): void {
  importVega = importer as () => Promise<VegaModule>;
}

export function loadVega(): Promise<VegaModule> {
  return importVega();
}
