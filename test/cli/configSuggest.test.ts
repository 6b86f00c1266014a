import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { run } from "../../src/cli/program.js";
import { sourcesFrom, solveJob } from "../../src/index.js";
import { fakeIo } from "./fakeIo.js";

const monthly = readFileSync(new URL("../../examples/harbourline-monthly.csv", import.meta.url), "utf8");
const pair = ["Stillwater Low Vol:Kestrel High Beta"];

async function job(command: "solve" | "roll", config: unknown) {
  const { io, stdout, stderr } = fakeIo({ "jobs/nightly.json": JSON.stringify(config), "jobs/desk.csv": monthly });
  const code = await run([command, "--config", "jobs/nightly.json"], io);
  return { code, stdout: stdout(), stderr: stderr() };
}

describe("a mistyped key: did you mean", () => {
  it("suggests the key of a config file a misspelt or kebab-case key means, and writes nothing", async () => {
    for (const [key, meant] of [
      ["wieght", "weight"],
      ["all-pairs", "allPairs"],
      ["hac_lags", "hacLags"],
    ] as const) {
      const { code, stdout, stderr } = await job("solve", { files: ["desk.csv"], pair, [key]: 2 });
      expect(code).toBe(exitCodes.usage);
      expect(stdout).toBe("");
      expect(stderr).toContain(`at '${key}'`);
      expect(stderr).toContain(`did you mean "${meant}"?`);
    }
  });

  it("suggests the command's own key before another command's (which that command would refuse)", async () => {
    // "stepz": solve's "steps" and roll's "step" are one edit away; for roll, "steps" is solve's key.
    const rolled = await job("roll", { files: ["desk.csv"], pair, window: 36, stepz: 12 });
    expect(rolled.code).toBe(exitCodes.usage);
    expect(rolled.stderr).toContain('did you mean "step"?');
    const solved = await job("solve", { files: ["desk.csv"], pair, stepz: 12 });
    expect(solved.stderr).toContain('did you mean "steps"?');
  });

  it("suggests the option a library call misspelt", async () => {
    const result = await solveJob(["m.csv"], { lwo: "Stillwater Low Vol", high: "Kestrel High Beta" } as never, {
      read: sourcesFrom({ "m.csv": monthly }),
    });
    expect(result.ok).toBe(false);
    if (!result.ok) {
      expect(result.issues.code).toBe("unknown-option");
      expect(result.issues.message).toBe('unknown option "lwo" (did you mean "low"?)');
    }
  });
});
