/** The published library entry (dist/index.js through the package's own "exports"), used without the CLI. */
import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";

const root = new URL("../../", import.meta.url).pathname;

describe('import { ... } from "betabound"', () => {
  it("gives the pure core, which solves a sample without loading the CLI's packages", () => {
    const script = `
      import { solve, assessUncertainty, implied } from "betabound";
      const low = [0.01, -0.02, 0.015, 0.004, -0.006, 0.012, 0.003, -0.011, 0.02, 0.001, -0.004, 0.007];
      const high = [0.02, -0.035, 0.03, 0.001, -0.012, 0.02, 0.004, -0.02, 0.033, 0.005, -0.01, 0.011];
      const result = solve({ low, high });
      const u = assessUncertainty({ low, high });
      console.log(JSON.stringify({ ok: result.ok, bounds: result.ok ? result.value.bounds.lowBeta : null, se: u.bounds.lowBeta.min.stdError > 0, implied: implied({ lowBeta: 0.7, weight: 0.5, factorVol: 0.04, factorMean: 0.005, lowNoiseVol: 0.01, highNoiseVol: 0.02 }, 3).truth.insideSet }));
    `;
    const result = spawnSync(process.execPath, ["--input-type=module", "-e", script], { cwd: root, encoding: "utf8" });
    expect(result.stderr).toBe("");
    const out = JSON.parse(result.stdout);
    expect(out.ok).toBe(true);
    expect(out.bounds.min).toBeLessThan(out.bounds.max);
    expect(out.se).toBe(true);
    expect(out.implied).toBe(true);
  });

  it("imports no package of the CLI (commander, zod, csv-parse) or the charts", () => {
    const library = readFileSync(`${root}dist/index.js`, "utf8");
    const imported = [...library.matchAll(/^import .* from "([^"]+)";?$/gm)].map((m) => m[1]);
    expect(imported.filter((name) => !name!.startsWith("node:"))).toEqual([]);
  });
});
