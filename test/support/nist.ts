/**
 * Readers for the NIST StRD fixture files in test/fixtures/nist-strd (see the README there for their
 * provenance). Certified values are parsed from each file's own header, never retyped, so a test's
 * expected value is exactly what NIST certifies.
 *
 * Both CRLF (the univariate files) and LF (Norris) line endings are accepted.
 */

import { readFileSync } from "node:fs";

const fixtureDir = new URL("../fixtures/nist-strd/", import.meta.url);

/** The nine univariate summary-statistics sets. */
export const univariateSetNames = ["NumAcc1", "NumAcc2", "NumAcc3", "NumAcc4", "PiDigits", "Lew", "Lottery", "Mavro", "Michelso"] as const;
export type UnivariateSetName = (typeof univariateSetNames)[number];

export interface UnivariateSet {
  readonly name: UnivariateSetName;
  readonly data: readonly number[];
  readonly certified: {
    /** "Sample Mean ybar". */
    readonly mean: number;
    /** "Sample Standard Deviation (denom. = n-1) s". */
    readonly stdev: number;
    /** "Sample Autocorrelation Coefficient (lag 1) r(1)". */
    readonly lag1Autocorrelation: number;
    /** "Number of Observations". */
    readonly observations: number;
  };
}

export interface CertifiedParameter {
  readonly estimate: number;
  readonly stdErr: number;
}

export interface NorrisSet {
  readonly x: readonly number[];
  readonly y: readonly number[];
  readonly certified: {
    readonly intercept: CertifiedParameter;
    readonly slope: CertifiedParameter;
    /** "Residual Standard Deviation", sqrt(SSR / (n - 2)). */
    readonly residualStdDev: number;
    readonly rSquared: number;
    /** Residual row of the certified analysis-of-variance table. */
    readonly residualDegreesOfFreedom: number;
    readonly residualSumOfSquares: number;
    readonly residualMeanSquare: number;
  };
}

function readLines(fileName: string): string[] {
  return readFileSync(new URL(fileName, fixtureDir), "utf8").split(/\r?\n/);
}

/** Parses a number in any of the StRD spellings (".11019", "760.", "0.4297E-03"), refusing anything else. */
function parseNumber(text: string, where: string): number {
  const trimmed = text.trim();
  if (!/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(trimmed)) {
    throw new Error(`${where}: not a number: ${JSON.stringify(text)}`);
  }
  return Number(trimmed);
}

/** The value after the last ':' on the single line that starts with `label` (after leading blanks). */
function labelledValue(lines: readonly string[], label: string, file: string): number {
  const hits = lines.filter((line) => line.trimStart().startsWith(label));
  if (hits.length !== 1) throw new Error(`${file}: expected one line starting "${label}", found ${hits.length}`);
  const line = hits[0] as string;
  return parseNumber(line.slice(line.lastIndexOf(":") + 1), `${file} ${label}`);
}

export function readUnivariateSet(name: UnivariateSetName): UnivariateSet {
  const file = `${name}.dat`;
  const lines = readLines(file);
  const certified = {
    mean: labelledValue(lines, "Sample Mean", file),
    stdev: labelledValue(lines, "Sample Standard Deviation", file),
    lag1Autocorrelation: labelledValue(lines, "Sample Autocorrelation Coefficient", file),
    observations: labelledValue(lines, "Number of Observations", file),
  };
  // The data follow the "Data: Y" caption and its rule of dashes (lines 59-60 in every file).
  const caption = lines.findIndex((line) => /^Data:\s*Y\s*$/.test(line.trim()));
  if (caption < 0 || !/^-+$/.test((lines[caption + 1] ?? "").trim())) throw new Error(`${file}: no "Data: Y" caption`);
  const data = lines
    .slice(caption + 2)
    .filter((line) => line.trim() !== "")
    .map((line, i) => parseNumber(line, `${file} data row ${i + 1}`));
  if (data.length !== certified.observations) {
    throw new Error(`${file}: ${data.length} data rows but the header certifies ${certified.observations}`);
  }
  return { name, data, certified };
}

export function readNorris(): NorrisSet {
  const file = "Norris.dat";
  const lines = readLines(file);
  const fields = (line: string): string[] => line.trim().split(/\s+/);
  const parameter = (name: string): CertifiedParameter => {
    const hits = lines.filter((line) => fields(line)[0] === name && fields(line).length === 3);
    if (hits.length !== 1) throw new Error(`${file}: expected one certified row for ${name}`);
    const [, estimate, stdErr] = fields(hits[0] as string);
    return { estimate: parseNumber(estimate ?? "", `${file} ${name}`), stdErr: parseNumber(stdErr ?? "", `${file} ${name} SE`) };
  };
  const afterLabel = (label: string): number => {
    // Only lines with a value after the label: "Standard Deviation" is also a column caption.
    const hits = lines.filter((line) => line.trimStart().startsWith(label) && line.trim().length > label.length);
    if (hits.length !== 1) throw new Error(`${file}: expected one line "${label} <value>", found ${hits.length}`);
    return parseNumber((hits[0] as string).trim().slice(label.length), `${file} ${label}`);
  };
  const residualRow = lines.filter((line) => fields(line)[0] === "Residual" && fields(line).length === 4);
  if (residualRow.length !== 1) throw new Error(`${file}: expected one ANOVA residual row`);
  const [, df, ssr, ms] = fields(residualRow[0] as string);

  const caption = lines.findIndex((line) => /^Data:\s+y\s+x\s*$/.test(line));
  if (caption < 0) throw new Error(`${file}: no "Data: y x" caption`);
  const x: number[] = [];
  const y: number[] = [];
  for (const line of lines.slice(caption + 1)) {
    if (line.trim() === "") continue;
    const [yText, xText, ...rest] = fields(line);
    if (rest.length > 0 || xText === undefined || yText === undefined) throw new Error(`${file}: bad data row ${JSON.stringify(line)}`);
    y.push(parseNumber(yText, `${file} y`));
    x.push(parseNumber(xText, `${file} x`));
  }
  return {
    x,
    y,
    certified: {
      intercept: parameter("B0"),
      slope: parameter("B1"),
      residualStdDev: afterLabel("Standard Deviation"),
      rSquared: afterLabel("R-Squared"),
      residualDegreesOfFreedom: parseNumber(df ?? "", `${file} residual df`),
      residualSumOfSquares: parseNumber(ssr ?? "", `${file} SSR`),
      residualMeanSquare: parseNumber(ms ?? "", `${file} residual mean square`),
    },
  };
}
