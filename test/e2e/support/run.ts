/** Runs the built executable (dist/cli.cjs) as a user would, for the end-to-end tests. */
import { spawnSync } from "node:child_process";
import { join } from "node:path";

export const root = new URL("../../../", import.meta.url).pathname;
export const cli = join(root, "dist/cli.cjs");
export const monthly = join(root, "examples/harbourline-monthly.csv");
export const books = ["--low", "Stillwater Low Vol", "--high", "Kestrel High Beta"];

export interface Run {
  readonly code: number | null;
  readonly signal: NodeJS.Signals | null;
  readonly stdout: string;
  readonly stderr: string;
}

/** Runs `betabound args` in `cwd` with `input` on standard input (or a file descriptor). */
export function betabound(args: readonly string[], options: { cwd?: string; input?: string; stdin?: number } = {}): Run {
  const result = spawnSync(process.execPath, [cli, ...args], {
    cwd: options.cwd,
    input: options.input,
    stdio: [options.stdin ?? "pipe", "pipe", "pipe"],
    encoding: "utf8",
    // One process, whatever the developer's environment (hugePages.ts has tests of its own).
    env: { ...process.env, NO_COLOR: "1", BETABOUND_HUGE_PAGES: "off" },
    maxBuffer: 1 << 30,
  });
  return { code: result.status, signal: result.signal, stdout: result.stdout, stderr: result.stderr };
}
