/**
 * How the charts get vega: a function that imports it, handed to the renderers. By default the plain
 * dynamic import (the library, tests). The CLI's bundle runs as a classic script compiled with V8's
 * code cache (src/cli/runtime/bundleLoader.ts), where `import()` cannot be used, so its launcher
 * hands in an importer of its own through the CLI's io (src/cli/runtime/io.ts).
 */
export type VegaModule = typeof import("vega");
export type VegaLoader = () => Promise<VegaModule>;

export const importVega: VegaLoader = () => import("vega");
