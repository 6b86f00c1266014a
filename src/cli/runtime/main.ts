/**
 * The bundled CLI's entry (dist/cli-bundle.cjs, loaded by the `betabound` launcher, launcher.ts):
 * binds the program to the process. An unexpected exception is a bug: it is reported in one line
 * with exit code 70 (set BETABOUND_DEBUG=1 for the stack).
 */
import { exitCodes, type ExitCode } from "./exitCodes.js";
import { openSink, readInputBytes, writeFileAtomic } from "./files.js";
import type { VegaLoader } from "../../report/charts/loadVega.js";
import type { CliIo } from "./io.js";
import { run } from "../program.js";

export { run };

/** What the launcher hands in: the bundle cannot import() on its own (see bundleLoader.ts). */
export interface Launch {
  readonly loadVega: VegaLoader;
}

/** The CLI's seams bound to this process. */
export function processIo(launch: Launch): CliIo {
  return {
    loadVega: launch.loadVega,
    writeOut: (text: string) => void process.stdout.write(text),
    writeErr: (text: string) => void process.stderr.write(text),
    readInput: readInputBytes,
    writeOutput: writeFileAtomic,
    openSink,
    // Getters: each stream is set up only when a run asks (stdin's, for instance, loads the network
    // modules when it is a pipe, a few milliseconds that most runs, given files, never need).
    get stdoutIsTerminal() {
      return process.stdout.isTTY === true;
    },
    get stdinIsTerminal() {
      return process.stdin.isTTY === true;
    },
    get stderrIsTerminal() {
      return process.stderr.isTTY === true;
    },
    now: () => performance.now(),
    env: process.env,
  };
}

/** Runs the command line `argv` (without node and the script) and ends the process with its exit code. */
export async function main(argv: readonly string[], launch: Launch): Promise<void> {
  // A closed pipe (e.g. `betabound solve ... | head`) is not an error of ours.
  process.stdout.on("error", (error: NodeJS.ErrnoException) => {
    if (error.code === "EPIPE") process.exit(exitCodes.ok);
  });
  let code: ExitCode;
  try {
    code = await run(argv, processIo(launch));
  } catch (error) {
    const detail = error instanceof Error ? error.message : String(error);
    process.stderr.write(`error: internal error (a bug in betabound, please report it with the command line): ${detail}\n`);
    if (process.env.BETABOUND_DEBUG === "1" && error instanceof Error) process.stderr.write(`${error.stack ?? ""}\n`);
    code = exitCodes.internal;
  }
  exitOnceFlushed(code);
}

/**
 * Ends the process as soon as everything written to stdout and stderr has been handed to the system.
 * Waiting for the event loop to drain instead would also wait for V8's background compilations of
 * hot functions, which the finished run no longer needs (about 10 ms of every short run). Every file
 * the command writes has been closed and renamed by now; worker threads have been terminated.
 */
function exitOnceFlushed(code: ExitCode): void {
  process.exitCode = code;
  let pending = 2;
  const flushed = (): void => {
    pending -= 1;
    if (pending === 0) process.exit(code);
  };
  process.stdout.write("", flushed);
  process.stderr.write("", flushed);
}
