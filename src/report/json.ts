/**
 * The machine-readable report: one JSON document whose shape is the contract described by
 * src/schema/solveOutput.ts (schemaVersion 1). Numbers are written at full double precision by
 * JSON.stringify (shortest round-trip form; -0 is written as 0); there is never a NaN or an
 * infinity, because the core uses null for undefined quantities and this module refuses to write one.
 */

import type { Solution } from "../core/types.js";
import { conventionsFor, type Conventions } from "./conventions.js";
import type { InputDescription, RenderOptions, SolveReport } from "./types.js";

export const schemaVersion = 1;

/** The JSON document renderJson writes. */
export interface SolveOutput
  extends Pick<Solution, "observations" | "weight" | "moments" | "capm" | "bounds" | "grid" | "landmarks" | "diagnostics"> {
  readonly schemaVersion: typeof schemaVersion;
  readonly tool: SolveReport["tool"];
  /** "ok": an identified set was found; "rejected": the data were read but no set can be reported. */
  readonly status: "ok" | "rejected";
  readonly input: InputDescription;
  readonly conventions: Conventions;
}

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
    rowsRead: input.rowsRead,
    rowsDropped: input.rowsDropped,
    droppedDates: [...input.droppedDates],
    frequency: input.frequency === null ? null : { name: input.frequency.name, periodsPerYear: input.frequency.periodsPerYear },
    join:
      input.join === null
        ? null
        : {
            sides: input.join.sides.map((side) => ({ source: side.source, column: side.column, dates: side.dates, unmatched: side.unmatched })),
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
    capm: s.capm,
    bounds: s.bounds,
    grid: s.grid,
    landmarks: s.landmarks,
    diagnostics: s.diagnostics,
    conventions: conventionsFor(report),
  };
}

/**
 * Throws a RangeError naming the path of the first non-finite number or undefined value in `value`
 * (JSON.stringify would silently turn the one into null and drop the other).
 */
export function assertJsonSafe(value: unknown, path = "$"): void {
  if (typeof value === "number") {
    if (!Number.isFinite(value)) throw new RangeError(`renderJson: ${path} is ${value}; the core must use null instead`);
  } else if (value === undefined || typeof value === "function" || typeof value === "bigint" || typeof value === "symbol") {
    throw new RangeError(`renderJson: ${path} is a ${typeof value}, which JSON cannot represent`);
  } else if (Array.isArray(value)) {
    value.forEach((item, i) => assertJsonSafe(item, `${path}[${i}]`));
  } else if (value !== null && typeof value === "object") {
    for (const [key, item] of Object.entries(value)) assertJsonSafe(item, `${path}.${key}`);
  }
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
