/**
 * The `betabound` executable (built to dist/cli.cjs, a CommonJS file: Node starts those faster than
 * an ES module): loads the bundled CLI next to it, through the code cache when there is one
 * (bundleLoader.ts), and runs the command line; or, for large inputs on Linux, has a child process
 * with huge pages run it (hugePages.ts). `__dirname` is the folder of the built file.
 */
import { loadCliBundle } from "./bundleLoader.js";
import { processFacts, runWithHugePages, wantsHugePages } from "./hugePages.js";

const argv = process.argv.slice(2);
// import() is not available in a script compiled from a code cache (the bundle): vega is imported here.
const runHere = (): void => void loadCliBundle(__dirname).bundle.main(argv, { loadVega: () => import("vega") });
const { relaunch, warning } = wantsHugePages(process.env, processFacts(argv));
if (warning !== null) process.stderr.write(warning);
if (relaunch) runWithHugePages(__filename, argv, runHere);
else runHere();
