/**
 * The `betabound` executable (built to dist/cli.cjs, a CommonJS file: Node starts those faster than
 * an ES module): loads the bundled CLI next to it, through the code cache when there is one
 * (bundleLoader.ts), and runs the command line. `__dirname` is the folder of the built file.
 */
import { loadCliBundle } from "./bundleLoader.js";

// import() is not available in a script compiled from a code cache (the bundle): vega is imported here.
void loadCliBundle(__dirname).bundle.main(process.argv.slice(2), { loadVega: () => import("vega") });
