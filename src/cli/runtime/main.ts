/**
 * The bundled CLI's entry (dist/cli-bundle.cjs, loaded by the `betabound` launcher, launcher.ts):
 * binds the program to the process. An unexpected exception is a bug: it is reported in one line
 * with exit code 70 (set BETABOUND_DEBUG=1 for the stack). Signals and standard output's failures
 * end the run here, after removing every temporary file (output.ts).
 */
import { existsSync } from "node:fs";
import { dirname, isAbsolute, join } from "node:path";
import { constants } from "node:os";
import type { VegaLoader } from "../../report/charts/loadVega.js";
import { run } from "../program.js";
import { describeCliIssue, fileErrorReason } from "../messages.js";
import { exitCodes, type ExitCode } from "./exitCodes.js";
import { identify, readInputBytes, readInputSource } from "./files.js";
import type { CliIo } from "./io.js";
import { openOutput, removeTemporaries } from "./output.js";
import { endingSignals } from "./signals.js";
import { prefaultFacts, pretouchingMemory, wantsPrefault } from "./pretouch.js";
import { useFreshMemory } from "../../core/numerics/freshMemory.js";

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
    readInput: (path) => readInputBytes(path),
    readSource: (path) => readInputSource(path),
    openOutput: (path) => openOutput(path, process.stdout),
    identify,
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

/** Ends the process at once with `code`, temporary files removed (nothing else is left to clean). */
function stop(code: number): never {
  removeTemporaries();
  process.exit(code);
}

/** Runs the command line `argv` (without node and the script) and ends the process with its exit code. */
export async function main(argv: readonly string[], launch: Launch): Promise<void> {
  // The handlers stay installed: a second signal (Ctrl-C reaches a child run with huge pages both from
  // the terminal and from its parent, hugePages.ts) must not find the default action mid-clean-up.
  for (const signal of endingSignals) process.on(signal, () => stop(128 + constants.signals[signal]));
  // Standard error that cannot be written (a full disk under `2>>log`, a closed pipe) loses the
  // messages, not the run: its exit status stays the one the run earned.
  process.stderr.on("error", () => undefined);
  process.stdout.on("error", (error: NodeJS.ErrnoException) => {
    // A reader that closed the pipe (`betabound roll ... | head`) wants no more: stop the work at once,
    // quietly, with the status a shell gives a process ended by SIGPIPE (exitCodes.pipeClosed).
    if (error.code === "EPIPE") stop(exitCodes.pipeClosed);
    process.stderr.write(`error: ${describeCliIssue({ code: "stdout-failed", reason: fileErrorReason(error) })}\n`);
    stop(exitCodes.output);
  });
  // Long arrays readied on a worker thread (pretouch.ts); nothing starts until a run needs one.
  const prefault = wantsPrefault(process.env, prefaultFacts());
  if (prefault.warning !== null) process.stderr.write(prefault.warning);
  if (prefault.use) useFreshMemory(pretouchingMemory());
  let code: ExitCode;
  try {
    code = await run(argv, processIo(launch));
  } catch (error) {
    const filesOut = outOfFiles(error);
    if (filesOut !== null) {
      // The system's limit, not a bug: drawing a chart loads a few hundred modules. No file was replaced.
      process.stderr.write(`error: ${describeCliIssue({ code: "too-many-files", reason: filesOut })}\n`);
      exitOnceFlushed(exitCodes.output);
      return;
    }
    const detail = error instanceof Error ? error.message : String(error);
    process.stderr.write(`error: internal error (a bug in betabound, please report it with the command line): ${detail}\n`);
    if (process.env.BETABOUND_DEBUG === "1" && error instanceof Error) process.stderr.write(`${error.stack ?? ""}\n`);
    code = exitCodes.internal;
  }
  exitOnceFlushed(code);
}

/**
 * Why, when `error` comes of the limit of open files: EMFILE or ENFILE, or a module "not found" that is
 * there (Node's module loader reports a package it could not open for want of descriptors so; a stat
 * needs no descriptor, where reading /proc/self/limits would).
 */
function outOfFiles(error: unknown): string | null {
  const errno = (error as NodeJS.ErrnoException | null)?.code;
  if (errno === "EMFILE" || errno === "ENFILE") return fileErrorReason(error);
  if (errno !== "ERR_MODULE_NOT_FOUND" || !(error instanceof Error)) return null;
  // Under the limit the loader names a file of a package that is installed (its package.json there);
  // a package that is not installed at all ("Cannot find package 'vega'") is a broken install: a bug.
  const missing = /Cannot find (?:package|module) '([^']+)'/.exec(error.message)?.[1];
  const folder = missing === undefined || !isAbsolute(missing) ? null : dirname(missing);
  return folder !== null && existsSync(join(folder, "package.json")) ? `could not open the installed module '${folder}'` : null;
}

/**
 * Ends the process as soon as everything written to stdout and stderr has been handed to the system.
 * Waiting for the event loop to drain instead would also wait for V8's background compilations of
 * hot functions, which the finished run no longer needs (about 10 ms of every short run). Every file
 * the command writes has been closed and renamed by now; worker threads have been terminated. A
 * failure to write standard output is reported by its error handler above, which ends the process.
 */
function exitOnceFlushed(code: ExitCode): void {
  process.exitCode = code;
  let pending = 2;
  const done = (): void => {
    pending -= 1;
    if (pending === 0) process.exit(code);
  };
  process.stdout.write("", (error?: Error | null) => {
    if (!error) done(); // else the stream's error handler reports it and ends the process
  });
  process.stderr.write("", () => done()); // a standard error that failed has nothing more to flush
}
