/**
 * A config file's key of another command is refused (exit 1, naming the key, the file and the command
 * it belongs to); a file shared by solve and roll keeps such keys under the command's name.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { run } from "../../src/cli/program.js";
import { parseConfig } from "../../src/options/index.js";
import { fakeIo } from "./fakeIo.js";

const monthly = readFileSync(new URL("../../examples/harbourline-monthly.csv", import.meta.url), "utf8");
const rows = monthly.trim().split("\n").length - 1;
const books = { files: ["desk.csv"], pair: ["Stillwater Low Vol:Kestrel High Beta"], rf: 0.002 };

async function runWith(command: "solve" | "roll", config: unknown, args: string[] = []) {
  const { io, stdout, stderr, written } = fakeIo({ "shared/risk.json": JSON.stringify(config), "shared/desk.csv": monthly });
  const code = await run([command, "--config", "shared/risk.json", ...args], io);
  return { code, stdout: stdout(), stderr: stderr(), written };
}

describe("a key of another command", () => {
  it("is refused by solve, naming the key, the file and the command it belongs to, and nothing is written", async () => {
    const { code, stdout, stderr, written } = await runWith("solve", { ...books, window: 60, output: "out.jsonl" });
    expect(code).toBe(exitCodes.usage);
    expect(stdout).toBe("");
    expect(written.size).toBe(0);
    expect(stderr).toContain("config file 'shared/risk.json', at 'window': a key of roll, not of solve");
    expect(stderr).toContain('keep it under "roll": {...}');
  });

  it("is refused by roll: solve's steps (a near miss of roll's step) does not pass unseen", async () => {
    const { code, stderr } = await runWith("roll", { ...books, window: 60, steps: 12 });
    expect(code).toBe(exitCodes.usage);
    expect(stderr).toContain("at 'steps': a key of solve and implied, not of roll");
    expect(stderr).toContain('under "solve"');
  });

  it("offers no section for a command that reads no config file", () => {
    const parsed = parseConfig(JSON.stringify({ ...books, lowBeta: 0.7 }), "solve");
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.issues).toEqual({ at: "lowBeta", reason: "a key of implied and simulate, not of solve: remove it" });
  });

  it("is refused inside a job too, by its place", async () => {
    const { code, stderr } = await runWith("solve", { format: "jsonl", jobs: [books, { ...books, window: 36 }] });
    expect(code).toBe(exitCodes.usage);
    expect(stderr).toContain("at 'jobs.1.window': a key of roll, not of solve");
  });
});

describe("a file shared by solve and roll", () => {
  const shared = {
    ...books,
    solve: { format: "json", steps: 3 },
    roll: { format: "csv", window: 60, step: 12 },
  };

  it("gives each command its own section over the common keys", async () => {
    const solved = await runWith("solve", shared);
    expect(solved.stderr).toBe("");
    expect(solved.code).toBe(exitCodes.ok);
    const document = JSON.parse(solved.stdout);
    expect(document.grid).toHaveLength(3);
    expect(document.input.riskFree).toEqual({ kind: "constant", rate: 0.002 });

    const rolled = await runWith("roll", shared);
    expect(rolled.stderr).toBe("");
    expect(rolled.code).toBe(exitCodes.ok);
    const lines = rolled.stdout.trim().split("\n");
    // Windows of 60 every 12 rows, the newest ending on the last row: (rows - 60) / 12 + 1 of them.
    expect(lines).toHaveLength(1 + Math.floor((rows - 60) / 12) + 1);
    expect(lines[0]).toMatch(/^source,lowColumn,highColumn,/);
  });

  it("lets a flag override a section's key", async () => {
    const { stdout } = await runWith("solve", shared, ["--steps", "5"]);
    expect(JSON.parse(stdout).grid).toHaveLength(5);
  });

  it("checks the other command's section: its mistakes are found whichever command runs", async () => {
    const typo = await runWith("solve", { ...shared, roll: { windw: 60 } });
    expect(typo.code).toBe(exitCodes.usage);
    expect(typo.stderr).toContain(`at 'roll.windw': unknown key (did you mean "window"?)`);
    const misplaced = await runWith("solve", { ...shared, roll: { window: 60, steps: 3 } });
    expect(misplaced.stderr).toContain("at 'roll.steps': a key of solve and implied, not of roll");
    const badValue = await runWith("solve", { ...shared, roll: { window: "sixty" } });
    expect(badValue.stderr).toContain("at 'roll.window'");
    const ownMisplaced = await runWith("solve", { ...shared, solve: { window: 60 } });
    expect(ownMisplaced.stderr).toContain("at 'solve.window': a key of roll, not of solve");
  });

  it("refuses a section that is not an object, or that holds files, jobs or a section", async () => {
    for (const [section, at] of [
      [{ solve: 3 }, "solve"],
      [{ solve: { files: ["desk.csv"] } }, "solve.files"],
      [{ solve: { jobs: [] } }, "solve.jobs"],
      [{ solve: { roll: {} } }, "solve.roll"],
    ] as const) {
      const { code, stderr } = await runWith("solve", { ...books, ...section });
      expect(code).toBe(exitCodes.usage);
      expect(stderr).toContain(`at '${at}'`);
    }
  });

  it("applies solve's section to every job, and refuses a section inside a job", async () => {
    const jobs = { format: "jsonl", solve: { steps: 4 }, jobs: [books, books] };
    const { code, stdout } = await runWith("solve", jobs);
    expect(code).toBe(exitCodes.ok);
    const records = stdout
      .trim()
      .split("\n")
      .map((line) => JSON.parse(line));
    expect(records.map((r) => r.grid.length)).toEqual([4, 4]);
    const inside = await runWith("solve", { format: "jsonl", jobs: [{ ...books, solve: { steps: 4 } }] });
    expect(inside.code).toBe(exitCodes.usage);
    expect(inside.stderr).toContain("at 'jobs.0.solve'");
  });
});
