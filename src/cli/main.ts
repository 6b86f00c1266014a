/**
 * Entry point of the `betabound` executable: binds the CLI to the process. An unexpected exception
 * is a bug: it is reported in one line with exit code 70 (set BETABOUND_DEBUG=1 for the stack).
 */
import { exitCodes } from "./exitCodes.js";
import { openSink, readInputBytes, writeFileAtomic } from "./files.js";
import { run } from "./program.js";

const io = {
  writeOut: (text: string) => void process.stdout.write(text),
  writeErr: (text: string) => void process.stderr.write(text),
  readInput: readInputBytes,
  writeOutput: writeFileAtomic,
  openSink,
  stdoutIsTerminal: process.stdout.isTTY === true,
  stdinIsTerminal: process.stdin.isTTY === true,
  stderrIsTerminal: process.stderr.isTTY === true,
  now: () => performance.now(),
  env: process.env,
};

// A closed pipe (e.g. `betabound solve ... | head`) is not an error of ours.
process.stdout.on("error", (error: NodeJS.ErrnoException) => {
  if (error.code === "EPIPE") process.exit(exitCodes.ok);
});

try {
  process.exitCode = await run(process.argv.slice(2), io);
} catch (error) {
  const detail = error instanceof Error ? error.message : String(error);
  process.stderr.write(`error: internal error (a bug in betabound, please report it with the command line): ${detail}\n`);
  if (process.env["BETABOUND_DEBUG"] === "1" && error instanceof Error) process.stderr.write(`${error.stack ?? ""}\n`);
  process.exitCode = exitCodes.internal;
}
