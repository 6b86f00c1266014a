/** Readers for the test/fixtures/inference data (see its README for the sources). Not a test file. */

import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";

const folder = fileURLToPath(new URL("../../fixtures/inference/", import.meta.url));

export function fixtureText(name: string): string {
  return readFileSync(folder + name, "utf8");
}

/** A CSV with a header row, as columns of numbers keyed by the unquoted header names (empty cell -> NaN). */
export function readCsvColumns(name: string): Record<string, number[]> {
  const lines = fixtureText(name).trim().split(/\r?\n/);
  const header = lines[0]!.split(",").map((h) => h.replace(/"/g, ""));
  const columns: Record<string, number[]> = Object.fromEntries(header.map((h) => [h, [] as number[]]));
  for (const line of lines.slice(1)) {
    line.split(",").forEach((cell, i) => columns[header[i]!]!.push(cell === "" ? Number.NaN : Number(cell)));
  }
  return columns;
}

/** The statsmodels test_hac_simple regression: 400 dlog realinv on [1, 400 dlog realgdp, realint(-1)]. */
export function macrodataRegression(): { design: Float64Array[]; y: Float64Array } {
  const data = readCsvColumns("macrodata.csv");
  const gdp = data.realgdp!;
  const inv = data.realinv!;
  const realint = data.realint!;
  const n = gdp.length - 1;
  const growth = (x: number[]) => Float64Array.from({ length: n }, (_, t) => 400 * (Math.log(x[t + 1]!) - Math.log(x[t]!)));
  return {
    design: [new Float64Array(n).fill(1), growth(gdp), Float64Array.from(realint.slice(0, n))],
    y: growth(inv),
  };
}

/** R sandwich's fm = lm(RealInv ~ RealGNP + RealInt, data = Investment): the first row (RealInt NA) dropped. */
export function investmentRegression(): { design: Float64Array[]; y: Float64Array } {
  const data = readCsvColumns("Investment.csv");
  const keep = data.RealInt!.map((v, i) => (Number.isNaN(v) ? -1 : i)).filter((i) => i >= 0);
  const pick = (name: string) => Float64Array.from(keep, (i) => data[name]![i]!);
  return {
    design: [new Float64Array(keep.length).fill(1), pick("RealGNP"), pick("RealInt")],
    y: pick("RealInv"),
  };
}

/** The AR(1) series of the arch block-length test (10,000 values, one per line). */
export function ar1Series(): Float64Array {
  return Float64Array.from(fixtureText("ar1_phi0.3_n10000.csv").trim().split(/\r?\n/), Number);
}
