import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { run } from "../../src/cli/program.js";
import { solveRecordSchema } from "../../src/schema/solveOutput.js";
import { fakeIo } from "./fakeIo.js";

const example = (path: string): string => readFileSync(new URL(`../../examples/${path}`, import.meta.url), "utf8");

/** The README's nightly job: examples/nightly.json (the README shows it), with the desks' files it names. */
const nightly = JSON.parse(example("nightly.json")) as Record<string, unknown>;
const deskFiles = { "desks/desk-a.csv": example("desks/desk-a.csv"), "desks/desk-b.csv": example("desks/desk-b.csv") };
const outputPath = "identified-sets.jsonl";

async function runJob(config: unknown, args: string[] = [], command = "solve") {
  const { io, stdout, stderr, written } = fakeIo({ "nightly.json": JSON.stringify(config), ...deskFiles });
  const code = await run([command, "--config", "nightly.json", ...args], io);
  return { code, stdout: stdout(), stderr: stderr(), written };
}

function records(text: string) {
  return text
    .trim()
    .split("\n")
    .map((line) => solveRecordSchema.parse(JSON.parse(line)));
}

describe("jobs in one config file", () => {
  it("runs the README's nightly example: each job's pairs on its own files, its own risk-free rate, exit 0", async () => {
    expect(Array.isArray(nightly.jobs)).toBe(true);
    const { code, stderr, written } = await runJob(nightly);
    expect(stderr).toBe("");
    expect(code).toBe(exitCodes.ok);
    const out = records(written.get(outputPath) ?? "");
    // Two jobs of one pair and one file each: two records, not every pair on every file.
    expect(out.map((r) => [r.input.source, r.input.lowColumn, r.status])).toEqual([
      ["desks/desk-a.csv", "Stillwater Low Vol", "ok"],
      ["desks/desk-b.csv", "Tidewater Low Vol", "ok"],
    ]);
    const [a, b] = out;
    if (a?.status === "failed" || b?.status === "failed" || a === undefined || b === undefined) throw new Error("a job failed");
    expect(a.input.riskFree).toEqual({ kind: "column", column: "Cash Rate" });
    // The second job's own rate, in the file's percent: 0.15% a period.
    expect(b.input.riskFree).toEqual({ kind: "constant", rate: 0.0015 });
    expect([a.input.units, b.input.units]).toEqual(["percent", "percent"]);
    // Each record is what solving that file alone with the job's options gives.
    const { io, stdout } = fakeIo(deskFiles);
    const alone = ["solve", "desks/desk-b.csv", "--low", "Tidewater Low Vol", "--high", "Kestrel High Beta", "--units", "percent"];
    expect(await run([...alone, "--rf", "0.15", "--format", "jsonl"], io)).toBe(exitCodes.ok);
    expect(JSON.parse(stdout())).toEqual(JSON.parse(JSON.stringify(b)));
  });

  it("lets a command-line flag override every job", async () => {
    const { code, written } = await runJob(nightly, ["--steps", "3"]);
    expect(code).toBe(exitCodes.ok);
    for (const record of records(written.get(outputPath) ?? "")) {
      expect("grid" in record && record.grid).toHaveLength(3);
    }
  });

  it("names a problem inside a job by its place, and writes nothing", async () => {
    const jobs = [...(nightly.jobs as object[])];
    for (const [job, at] of [
      [{ ...jobs[1], weight: "half" }, "jobs.1.weight"],
      [{ ...jobs[1], output: "b.jsonl" }, "jobs.1.output"],
      [{ ...jobs[1], wieght: 0.4 }, "jobs.1.wieght"],
    ] as const) {
      const { code, stdout, stderr, written } = await runJob({ ...nightly, jobs: [jobs[0], job] });
      expect(code).toBe(exitCodes.usage);
      expect(stdout).toBe("");
      expect(written.size).toBe(0);
      expect(stderr).toContain(`at '${at}'`);
    }
    const empty = await runJob({ ...nightly, jobs: [] });
    expect(empty.stderr).toContain("at 'jobs': must be a non-empty list");
  });

  it("refuses one JSON document for several jobs", async () => {
    const { code, stderr, written } = await runJob({ ...nightly, format: "json" });
    expect(code).toBe(exitCodes.usage);
    expect(written.size).toBe(0);
    expect(stderr).toContain("several jobs need --format jsonl");
  });

  it("is solve's: roll refuses jobs", async () => {
    const { code, stderr } = await runJob({ ...nightly, format: "csv", window: 36 }, [], "roll");
    expect(code).toBe(exitCodes.usage);
    expect(stderr).toContain("only solve runs several jobs");
  });
});
