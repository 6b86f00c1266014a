/**
 * The CLI run in this process: the program's `run(argv, io)` (src/cli/program.ts) with the io the
 * executable binds (src/cli/runtime/main.ts: the real file reads, the real output path with its
 * temporary files and renames, the real identity of paths), except that standard output and standard
 * error are captured as strings, and an exception ends the run with exit 70 and one line, as main.ts
 * ends it. It returns what `runCli` returns for the executable, so the same checks apply to both.
 *
 * What it does not cover, and the real-process runs must: the launcher and the bundle (dist/), the
 * process's exit code and its flushing of the streams, signals, and the bootstrap's worker threads
 * (from source they are absent, so the bootstrap runs in this thread: the same numbers bit for bit,
 * src/cli/runtime/bootstrapThreads.ts). Each run costs its work alone, not a node start-up.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { expect } from "vitest";
import { run } from "../../../src/cli/program.js";
import { identify, readInputBytes, readInputSource } from "../../../src/cli/runtime/files.js";
import type { CliIo } from "../../../src/cli/runtime/io.js";
import { openOutput } from "../../../src/cli/runtime/output.js";
import { version } from "../../../src/jobs/index.js";
import { importVega } from "../../../src/report/charts/loadVega.js";
import { type CliRun, describeRun, root, runCli } from "./cliRuns.js";

/** One run of the program with `args`, in this process (NO_COLOR set, no terminal, no standard input). */
export async function runInProcess(args: readonly string[]): Promise<CliRun> {
  // Bytes kept as bytes (copied: a writer reuses its buffers) and decoded once, as a pipe's reader does.
  const out: Buffer[] = [];
  const err: string[] = [];
  const stdout = {
    write: (chunk: string | Uint8Array) => out.push(Buffer.from(chunk)) > 0,
    once: () => undefined,
  };
  const io: CliIo = {
    loadVega: importVega,
    writeOut: (text) => void out.push(Buffer.from(text)),
    writeErr: (text) => void err.push(text),
    readInput: (path) => readInputBytes(path),
    readSource: (path) => readInputSource(path),
    openOutput: (path) => openOutput(path, stdout),
    identify,
    stdoutIsTerminal: false,
    stdinIsTerminal: false,
    stderrIsTerminal: false,
    now: () => performance.now(),
    env: { ...process.env, NO_COLOR: "1" },
  };
  let code: number;
  try {
    code = await run(args, io);
  } catch (error) {
    const detail = error instanceof Error ? error.message : String(error);
    err.push(`error: internal error (a bug in betabound, please report it with the command line): ${detail}\n`);
    code = 70;
  }
  return { args, code, stdout: Buffer.concat(out).toString("utf8"), stderr: err.join("") };
}

/** Every run of `argsList` in this process, one after another, in the order given. */
export async function runAllInProcess(argsList: readonly (readonly string[])[]): Promise<CliRun[]> {
  const results: CliRun[] = [];
  for (const args of argsList) results.push(await runInProcess(args));
  return results;
}

const packageVersion = (JSON.parse(readFileSync(join(root, "package.json"), "utf8")) as { version: string }).version;

/**
 * A run of the executable as the program from source would have written it: the bundle names the
 * package's version where the program built from source names `version` ("development"), the only
 * difference between the two.
 */
export function asFromSource(run: CliRun): CliRun {
  const restate = (text: string) => text.split(packageVersion).join(version);
  return { ...run, stdout: restate(run.stdout), stderr: restate(run.stderr) };
}

/**
 * Runs `args` in this process, then as the built executable, checks that the executable wrote what the
 * in-process run wrote (both streams, byte for byte, and the exit code), and returns the run.
 */
export async function runBothWays(args: readonly string[]): Promise<CliRun> {
  const inProcess = await runInProcess(args);
  const executable = asFromSource(await runCli(args));
  const written = (r: CliRun) => ({ code: r.code, stdout: r.stdout, stderr: r.stderr });
  expect(written(executable), `${describeRun(executable)}: the executable and the in-process run differ`).toEqual(written(inProcess));
  return executable;
}
