/**
 * Running the built executable (dist/cli.cjs) many times at once, for the catalogue and fuzz tests:
 * a small pool of child processes (the machine's cores, at most 4), and the checks every run must
 * pass whatever its input (no internal error, no NaN or infinity in a successful output, no stack
 * trace, nothing on standard output for a refused command line or input).
 */
import { execFile } from "node:child_process";
import { availableParallelism } from "node:os";
import { join } from "node:path";

export const root = new URL("../../../", import.meta.url).pathname;
export const cli = join(root, "dist/cli.cjs");
export const monthly = join(root, "examples/harbourline-monthly.csv");
export const books = ["--low", "Stillwater Low Vol", "--high", "Kestrel High Beta"];

export interface CliRun {
  readonly args: readonly string[];
  readonly code: number;
  readonly stdout: string;
  readonly stderr: string;
}

/** One run of the executable with `args` (NO_COLOR set, no standard input). */
export function runCli(args: readonly string[]): Promise<CliRun> {
  return new Promise((resolve) => {
    const child = execFile(
      process.execPath,
      [cli, ...args],
      { encoding: "utf8", env: { ...process.env, NO_COLOR: "1" }, maxBuffer: 256 * 1024 * 1024 },
      (error, stdout, stderr) => {
        const code = error === null ? 0 : typeof error.code === "number" ? error.code : -1;
        resolve({ args, code, stdout, stderr });
      },
    );
    child.stdin?.end();
  });
}

/** Every run of `argsList`, at most `limit` at a time, in the order given. */
export async function runAll(argsList: readonly (readonly string[])[], limit = Math.min(4, availableParallelism())): Promise<CliRun[]> {
  const results: CliRun[] = new Array(argsList.length);
  let next = 0;
  const worker = async (): Promise<void> => {
    while (next < argsList.length) {
      const index = next++;
      results[index] = await runCli(argsList[index]!);
    }
  };
  await Promise.all(Array.from({ length: Math.min(limit, argsList.length) }, worker));
  return results;
}

/** A NaN or an infinity written as a number in an output (JSON, CSV or text). */
const nonFinite = /(^|[^A-Za-z])(NaN|-?Infinity)([^A-Za-z]|$)/m;
/** A line of a JavaScript stack trace. */
const stackLine = /^\s+at .+(\(|:\d+:\d+)/m;

/** What is wrong with a run whatever its input: the empty list when nothing is. */
export function contractBreaches(run: CliRun): string[] {
  const breaches: string[] = [];
  if (run.code === 70) breaches.push(`exit 70 (internal error): ${run.stderr.trim().split("\n")[0]}`);
  if (run.code === 0 && nonFinite.test(run.stdout))
    breaches.push(`exit 0 with NaN or Infinity in stdout: ${run.stdout.match(nonFinite)?.[0]}`);
  if (stackLine.test(run.stderr)) breaches.push("a stack trace on stderr");
  if ((run.code === 1 || run.code === 2) && !refusalOutput(run))
    breaches.push(`exit ${run.code} with output on stdout: ${run.stdout.slice(0, 200)}`);
  if (![0, 1, 2, 3, 4, 5].includes(run.code)) breaches.push(`an undocumented exit code ${run.code}`);
  return breaches;
}

/** The value after `flag` in a run's arguments (the last one given), if any. */
export function flagValue(args: readonly string[], flag: string): string | undefined {
  const at = args.lastIndexOf(flag);
  return at >= 0 ? args[at + 1] : undefined;
}

/**
 * What a refused run may write on stdout: nothing, except that with exit 2 `--format jsonl` writes a
 * record of each failed pair (`status: "failed"`, the README's contract for streams of records), and
 * `roll --format csv` its header line, written before the first pair is read (the command's stream
 * opens with it).
 */
function refusalOutput(run: CliRun): boolean {
  if (run.stdout === "") return true;
  if (run.code !== 2) return false;
  const format = flagValue(run.args, "--format");
  const lines = run.stdout.trimEnd().split("\n");
  if (format === "jsonl") return lines.every((line) => (JSON.parse(line) as { status?: unknown }).status === "failed");
  return run.args[0] === "roll" && format === "csv" && lines.length === 1 && lines[0]!.startsWith("source,lowColumn,highColumn,");
}

/** The run as one line, for a failure message. */
export const describeRun = (run: CliRun): string =>
  `betabound ${run.args.map((a) => (/\s/.test(a) ? JSON.stringify(a) : a)).join(" ")} -> exit ${run.code}`;
