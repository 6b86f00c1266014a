// Loaded with `node --import`: records every bare package specifier the program imports into the
// file named by BETABOUND_TRACE_FILE, so a test can tell which packages a run loaded.
import { register } from "node:module";

register("./traceHooks.mjs", import.meta.url);
