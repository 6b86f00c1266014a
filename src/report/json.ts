/**
 * The machine-readable report: one JSON document whose shape is the contract described by
 * src/schema/solveOutput.ts (schemaVersion 2). Numbers are written at full double precision by
 * JSON.stringify (shortest round-trip form; -0 is written as 0); there is never a NaN or an
 * infinity, because the core uses null for undefined quantities and this module refuses to write one.
 */

import type { Uncertainty } from "../core/inference/uncertaintyTypes.js";
import type { Solution } from "../core/types.js";
import type { SolveOutputJson } from "../schema/solveOutput.js";
import { conventionsFor } from "./conventions.js";
import { reportDiagnostics } from "./diagnosticList.js";
import { indexOutput, sensitivityOutput } from "./modelsJson.js";
import type { InputDescription, RenderOptions, SolveReport } from "./types.js";

export const schemaVersion = 2 as const;

/** The JSON document renderJson writes: its type is the output schema's (src/schema/solveOutput.ts). */
export type SolveOutput = SolveOutputJson;
type CapmOutput = SolveOutput["capm"];
type UncertaintyOutput = NonNullable<SolveOutput["uncertainty"]>;

/** Copies the input description field by field, so the key order is fixed and no stray field leaks out. */
function inputOf(input: InputDescription): InputDescription {
  return {
    source: input.source,
    dateColumn: input.dateColumn,
    lowColumn: input.lowColumn,
    highColumn: input.highColumn,
    riskFree: input.riskFree,
    units: input.units,
    firstDate: input.firstDate,
    lastDate: input.lastDate,
    layout: input.layout,
    inputKind: input.inputKind,
    block: input.block,
    rowsRead: input.rowsRead,
    rowsUsed: input.rowsUsed,
    rowsDropped: input.rowsDropped,
    rowsConsumed: input.rowsConsumed,
    droppedDates: [...input.droppedDates],
    frequency: input.frequency === null ? null : { name: input.frequency.name, periodsPerYear: input.frequency.periodsPerYear },
    join:
      input.join === null
        ? null
        : {
            sides: input.join.sides.map((side) => ({
              source: side.source,
              column: side.column,
              dates: side.dates,
              unmatched: side.unmatched,
            })),
            matched: input.join.matched,
          },
  };
}

/** The JSON document for a report, as a value (what renderJson serialises). */
export function toSolveOutput(report: SolveReport): SolveOutput {
  const s = report.solution;
  return {
    schemaVersion,
    tool: { name: report.tool.name, version: report.tool.version },
    status: s.bounds === null ? "rejected" : "ok",
    input: inputOf(report.input),
    observations: s.observations,
    weight: s.weight,
    moments: s.moments,
    capm: capmOutput(s.capm, report.uncertainty),
    bounds: s.bounds,
    grid: s.grid,
    landmarks: s.landmarks,
    diagnostics: reportDiagnostics(report),
    uncertainty: uncertaintyOutput(report.uncertainty),
    pricing: report.pricing,
    index: indexOutput(report.index),
    sensitivity: sensitivityOutput(report.sensitivity),
    factorModel: report.factorModel,
    conventions: conventionsFor(report),
  };
}

function capmOutput(capm: Solution["capm"], uncertainty: Uncertainty | null): CapmOutput {
  return {
    low: { ...capm.low, hac: uncertainty?.capm.low.hac ?? null },
    high: { ...capm.high, hac: uncertainty?.capm.high.hac ?? null },
    hac: uncertainty?.capm.hac ?? null,
  };
}

function uncertaintyOutput(u: Uncertainty | null): UncertaintyOutput | null {
  if (u === null) return null;
  return {
    confidence: u.confidence,
    method: u.method,
    bounds: u.bounds,
    lowBeta: u.lowBeta,
    highBeta: u.highBeta,
    sharpe: u.sharpe,
    bootstrap: u.bootstrap,
  };
}

/**
 * Throws a RangeError naming the path of the first non-finite number or undefined value in `value`
 * (JSON.stringify would silently turn the one into null and drop the other).
 */
export function assertJsonSafe(value: unknown, path = "$"): void {
  const found = firstUnsafe(value);
  if (found === null) return;
  const at = path + found.path;
  if (typeof found.value === "number") throw new RangeError(`renderJson: ${at} is ${found.value}; the core must use null instead`);
  throw new RangeError(`renderJson: ${at} is a ${typeof found.value}, which JSON cannot represent`);
}

/**
 * The first value JSON cannot hold, and its path below `value` (".key" and "[i]" steps); null when
 * there is none. The path is built only on the way back from a find: checking a document builds no strings.
 */
function firstUnsafe(value: unknown): { path: string; value: unknown } | null {
  if (typeof value === "number") return Number.isFinite(value) ? null : { path: "", value };
  if (value === undefined || typeof value === "function" || typeof value === "bigint" || typeof value === "symbol")
    return { path: "", value };
  if (value === null || typeof value !== "object") return null;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      // A hole is skipped, as forEach skips it (JSON.stringify writes null there).
      if (value[i] === undefined && !(i in value)) continue;
      const found = firstUnsafe(value[i]);
      if (found !== null) return { path: `[${i}]${found.path}`, value: found.value };
    }
    return null;
  }
  // Own enumerable keys in Object.keys's order (as JSON.stringify visits them), without an array of them.
  for (const key in value) {
    if (!Object.hasOwn(value, key)) continue;
    const found = firstUnsafe((value as Record<string, unknown>)[key]);
    if (found !== null) return { path: `.${key}${found.path}`, value: found.value };
  }
  return null;
}

/**
 * Renders a report as pretty JSON (2-space indent, trailing newline). Deterministic: the same report
 * gives the same bytes. `options` is accepted for a uniform renderer signature; JSON is never coloured.
 * @throws RangeError if the report holds a NaN, an infinity or an undefined value.
 */
export function renderJson(report: SolveReport, _options: RenderOptions): string {
  const output = toSolveOutput(report);
  assertJsonSafe(output);
  return `${JSON.stringify(output, null, 2)}\n`;
}
