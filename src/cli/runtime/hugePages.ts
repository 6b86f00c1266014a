/**
 * Huge pages for large inputs. On the virtual machines we measure on, the first touch of each 4 KiB
 * page of fresh memory costs about 10 microseconds (DEVELOPERS.md, "Fresh memory costs"): a second
 * of a 10-million-row run. Where Linux gives transparent huge pages on request ("madvise", the
 * default of several distributions), glibc's malloc asks for them when its tunable
 * glibc.malloc.hugetlb=1 is set (glibc 2.35 and later), and then one fault serves 2 MiB instead of
 * 4 KiB. glibc reads its tunables only when a process starts, from its environment; so the
 * executable, given inputs of `hugePagesFrom` bytes or more, runs the same command line once more in
 * a child process with the tunable set (standard streams shared, the ending signals passed on, its
 * exit status passed back). BETABOUND_HUGE_PAGES=off never does; =on does whatever the inputs' size.
 * Nothing else changes: the child runs the same program on the same arguments.
 */
import { fstatSync, readFileSync, statSync } from "node:fs";
import { createRequire } from "node:module";
import { constants } from "node:os";
import { endingSignals } from "./signals.js";
import { isSwitchSetting, readSwitch } from "./switchSetting.js";

/**
 * Inputs from this many bytes on are read in a child with huge pages. Measured on 2 cores (interleaved
 * medians, 2026-12-04, see bench/analysis.md, "Huge pages"): starting the child costs about 0.12 s
 * (node's own start-up and the spawn), and huge pages saved 0.07 s on a 58 MB file without the
 * uncertainty, 0.12 s with it, and 0.7 s on a 420 MB file: the child pays from about twice the 58 MB.
 */
export const hugePagesFrom = 128 * 1024 * 1024;

/** The tunable that has glibc's malloc ask for transparent huge pages. */
const tunable = "glibc.malloc.hugetlb=1";

/** What the decision depends on besides the environment; each is read only when it is needed. */
export interface HugePageFacts {
  readonly platform: string;
  /** The bytes of the files the command line names (and of standard input when it is a file). */
  readonly inputBytes: () => number;
  /** The mode of transparent huge pages ("always", "madvise", "never"), or null when unknown. */
  readonly transparentHugePages: () => string | null;
  /** glibc's version at run time ("2.36"), or null when the C library is another. */
  readonly glibc: () => string | null;
  /** Node's own options for this process (passed on to the child). */
  readonly execArgv: readonly string[];
}

/** Whether to run the command line again with huge pages, and why not when a setting is wrong. */
export function wantsHugePages(env: NodeJS.ProcessEnv, facts: HugePageFacts): { relaunch: boolean; warning: string | null } {
  const { setting, warning } = readSwitch(env, "BETABOUND_HUGE_PAGES");
  // Set already: this is the child (or the user chose glibc's tunables).
  if (setting === "off" || (env.GLIBC_TUNABLES ?? "").includes("glibc.malloc.hugetlb")) return { relaunch: false, warning };
  if (facts.platform !== "linux") return { relaunch: false, warning };
  // A run under the inspector stays in the process the debugger attached to.
  if (facts.execArgv.some((flag) => flag.startsWith("--inspect") || flag.startsWith("--debug"))) return { relaunch: false, warning };
  if (setting !== "on" && facts.inputBytes() < hugePagesFrom) return { relaunch: false, warning };
  // "always" gives them without asking; "never" not at all.
  if (facts.transparentHugePages() !== "madvise") return { relaunch: false, warning };
  return { relaunch: glibcAtLeast(facts.glibc(), 2, 35), warning };
}

function glibcAtLeast(version: string | null, major: number, minor: number): boolean {
  const match = /^(\d+)\.(\d+)/.exec(version ?? "");
  if (match === null) return false;
  const [got, gotMinor] = [Number(match[1]), Number(match[2])];
  return got > major || (got === major && gotMinor >= minor);
}

/**
 * The environment of the child: glibc's tunables with the huge-page one added, and BETABOUND_HUGE_PAGES
 * as it was read (a value it does not know, already warned about here, as auto).
 */
export function withHugePages(env: NodeJS.ProcessEnv): NodeJS.ProcessEnv {
  const tunables = env.GLIBC_TUNABLES;
  const setting = env.BETABOUND_HUGE_PAGES;
  return {
    ...env,
    GLIBC_TUNABLES: tunables === undefined || tunables === "" ? tunable : `${tunables}:${tunable}`,
    ...(setting === undefined || isSwitchSetting(setting) ? {} : { BETABOUND_HUGE_PAGES: "auto" }),
  };
}

/**
 * The flags whose value is a file written, not read (the option table's paths: the test checks the
 * two agree). The launcher does not load the table: it needs the bundle.
 */
export const writtenPathFlags: readonly string[] = ["--output", "--chart", "--report"];

/**
 * The bytes of the files named in `argv` (an argument that is an existing file, or PATH:COLUMN whose
 * PATH is one), and of standard input when it is a file and `-` is an argument or no argument names a
 * file. The value after a flag that names a file written (`writtenPathFlags`: an output about to be
 * replaced) does not count; the launcher does not parse the other options (that needs the bundle), so
 * an existing file given as another option's value (a configuration) counts. Standard input from a
 * pipe never counts (its size is unknown).
 */
export function commandLineBytes(argv: readonly string[], standardInput: () => number | null = standardInputSize): number {
  let bytes = 0;
  let named = false;
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i]!;
    if (writtenPathFlags.includes(arg)) i += 1;
    if (arg.startsWith("-")) continue;
    const size = fileSize(arg) ?? (arg.lastIndexOf(":") > 0 ? fileSize(arg.slice(0, arg.lastIndexOf(":"))) : null);
    if (size !== null) named = true;
    bytes += size ?? 0;
  }
  if (!named || argv.includes("-")) bytes += standardInput() ?? 0;
  return bytes;
}

/** The size of standard input when it is a file (not a pipe or a terminal). */
function standardInputSize(): number | null {
  try {
    const input = fstatSync(0);
    return input.isFile() ? input.size : null;
  } catch {
    return null; // none
  }
}

function fileSize(path: string): number | null {
  try {
    const stat = statSync(path, { throwIfNoEntry: false });
    return stat?.isFile() === true ? stat.size : null;
  } catch {
    return null;
  }
}

/** The facts of this process and machine. */
export function processFacts(argv: readonly string[]): HugePageFacts {
  return {
    platform: process.platform,
    execArgv: process.execArgv,
    inputBytes: () => commandLineBytes(argv),
    transparentHugePages: () => {
      try {
        return /\[(\w+)\]/.exec(readFileSync("/sys/kernel/mm/transparent_hugepage/enabled", "latin1"))?.[1] ?? null;
      } catch {
        return null;
      }
    },
    glibc: () => {
      const report = process.report?.getReport() as { header?: { glibcVersionRuntime?: string } } | undefined;
      return report?.header?.glibcVersionRuntime ?? null;
    },
  };
}

/** The signals that end a run (signals.ts): passed on to the child, which cleans up and exits 128 + n. */
const passedOn = endingSignals;

/**
 * Signals that end a process without a core dump: a child ended by one ends this process by the same
 * one. Any other (SIGABRT when V8 runs out of memory, SIGSEGV) ends it with 128 + its number instead,
 * the same status without a second core file or crash report for the launcher.
 */
const raisedAgain: ReadonlySet<string> = new Set(["SIGINT", "SIGTERM", "SIGHUP", "SIGKILL", "SIGPIPE", "SIGUSR1", "SIGUSR2", "SIGALRM"]);

/**
 * Runs `script` with `argv` in a child with huge pages and ends this process as the child ended (its
 * exit code, or the signal that killed it). Calls `runHere` instead when the child cannot start.
 */
export function runWithHugePages(script: string, argv: readonly string[], runHere: () => void): void {
  const { spawn } = createRequire(script)("node:child_process") as typeof import("node:child_process");
  let child: ReturnType<typeof spawn> | null = null;
  // Listening before the spawn: a signal meanwhile must not end this process by default and orphan
  // the child. Listeners run from the event loop, so by then `child` is set (or the spawn failed).
  const pass = (signal: NodeJS.Signals): void => {
    child?.kill(signal);
  };
  const stopPassing = (): void => {
    for (const signal of passedOn) process.off(signal, pass);
  };
  for (const signal of passedOn) process.on(signal, pass);
  try {
    child = spawn(process.execPath, [...process.execArgv, script, ...argv], { stdio: "inherit", env: withHugePages(process.env) });
  } catch {
    // Refused at once (an argument list too long with the added variable, no memory): run here.
    stopPassing();
    runHere();
    return;
  }
  let started = false;
  child.once("spawn", () => {
    started = true;
  });
  child.on("error", () => {
    if (started) return; // a signal that could not be passed on: the child has ended or is ending
    // It never started (spawn refused): the run happens here, as without huge pages.
    stopPassing();
    runHere();
  });
  child.once("exit", (code, signal) => {
    stopPassing();
    if (signal === null) process.exit(code ?? 1);
    // Ended by a signal: end this process by the same one (the status a shell reports is the same),
    // and, should it be one this process ignores, with 128 + its number.
    process.exitCode = 128 + (constants.signals[signal] ?? 0);
    if (raisedAgain.has(signal)) process.kill(process.pid, signal);
    else process.exit(process.exitCode);
  });
}
