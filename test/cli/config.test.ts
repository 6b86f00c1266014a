import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { run } from "../../src/cli/program.js";
import { fakeIo } from "./fakeIo.js";

const monthly = readFileSync(new URL("../../examples/harbourline-monthly.csv", import.meta.url), "utf8");

function job(config: unknown, args: string[] = []) {
  const { io, stdout, stderr } = fakeIo({ "jobs/nightly.json": JSON.stringify(config), "jobs/desk.csv": monthly });
  return run(["solve", "--config", "jobs/nightly.json", ...args], io).then((code) => ({ code, stdout: stdout(), stderr: stderr() }));
}

const nightly = {
  files: ["desk.csv"],
  pair: ["Stillwater Low Vol:Kestrel High Beta"],
  rf: 0.002,
  steps: 21,
  format: "jsonl",
};

describe("solve --config", () => {
  it("takes files (relative to the config file), pairs and options from the file", async () => {
    const { code, stdout } = await job(nightly);
    expect(code).toBe(exitCodes.ok);
    const record = JSON.parse(stdout.trim());
    expect(record.input.source).toBe("jobs/desk.csv");
    expect(record.input.riskFree).toEqual({ kind: "constant", rate: 0.002 });
    expect(record.grid).toHaveLength(21);
  });

  it("lets a flag on the command line override the file", async () => {
    const { stdout } = await job(nightly, ["--steps", "3"]);
    expect(JSON.parse(stdout.trim()).grid).toHaveLength(3);
  });

  it("names the path in the file of a value of the wrong type", async () => {
    const { code, stderr } = await job({ ...nightly, weight: "half" });
    expect(code).toBe(exitCodes.usage);
    expect(stderr).toContain("config file 'jobs/nightly.json', at 'weight'");
  });

  it("names an unknown key", async () => {
    const { code, stderr } = await job({ ...nightly, wieght: 0.4 });
    expect(code).toBe(exitCodes.usage);
    expect(stderr).toContain("wieght");
  });

  it("names the entry of a malformed pair", async () => {
    const { code, stderr } = await job({ ...nightly, pair: ["Stillwater Low Vol"] });
    expect(code).toBe(exitCodes.usage);
    expect(stderr).toContain("at 'pair.0'");
  });

  it("reports a file that is not JSON", async () => {
    const { io, stderr } = fakeIo({ "bad.json": "{ steps: 3 " });
    expect(await run(["solve", "--config", "bad.json"], io)).toBe(exitCodes.usage);
    expect(stderr()).toContain("config file 'bad.json': not valid JSON");
  });
});
