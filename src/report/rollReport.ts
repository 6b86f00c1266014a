/**
 * Outputs of `roll` (its CSV rows are rollCsv.ts's): JSON Lines records per window with `solve`'s
 * field names plus `start` and `end` dates, the text table for a person, and the chart's points.
 */

import type { WindowUncertainty } from "../core/inference/windowUncertainty.js";
import type { WindowSolution, WindowSpec } from "../core/rolling/index.js";
import { momentsFromSummary } from "../core/summaryMoments.js";
import { defaultConfidence } from "../core/parameters.js";
import type { RollOutputJson } from "../schema/rollOutput.js";
import type { RollWindowPoint } from "./charts/rollChart.js";
import { formatNumber } from "./format.js";
import { assertJsonSafe, schemaVersion } from "./json.js";
import { fields, indent, table, type Style } from "./layout.js";
import type { InputWarningDiagnostic } from "../input/index.js";
import type { InputDescription, SolveReport } from "./types.js";

export interface RollMeta {
  readonly tool: SolveReport["tool"];
  readonly input: InputDescription;
  readonly spec: WindowSpec;
  readonly weight: number;
  /**
   * The dates as text, a string per row: the job makes them on first use (a getter), so pass `meta`
   * along rather than copying it (`{ ...meta }` would make a million strings for a million rows).
   */
  readonly dates: readonly string[];
  /** The dates as stamps of one form, when they are (ReturnTable.stamps): written as bytes without `dates`. */
  readonly stamps?: { readonly keys: Float64Array; readonly form: number };
  /** Warnings from reading the file(s): every window's record lists them first among its diagnostics. */
  readonly inputWarnings: readonly InputWarningDiagnostic[];
}

/** A window's point on the roll chart: its end date, bounds, CAPM beta and interval. */
export function rollChartPoint(meta: RollMeta, w: WindowSolution, u: WindowUncertainty | null): RollWindowPoint {
  return {
    end: meta.dates[w.end] ?? "",
    lowBetaMin: w.bounds?.lowBeta.min ?? null,
    lowBetaMax: w.bounds?.lowBeta.max ?? null,
    capmLowBeta: w.capm?.low.beta ?? Number.NaN,
    ...(u === null ? {} : { interval: { lower: u.lowBeta.interval.lower, upper: u.lowBeta.interval.upper } }),
  };
}

/** The window in words, for the chart: "rolling windows of 36 periods". */
export function windowWords(spec: WindowSpec): string {
  return spec.kind === "window" ? `rolling windows of ${spec.size} periods` : `expanding windows from ${spec.minPeriods} periods`;
}

/** One JSON Lines record for a window: solve's field names, plus `window`, `start` and `end`. */
export function rollRecord(meta: RollMeta, window: WindowSolution, uncertainty: WindowUncertainty | null): RollOutputJson {
  const { input } = meta;
  const record = {
    schemaVersion,
    tool: { name: meta.tool.name, version: meta.tool.version },
    command: "roll" as const,
    status: window.bounds === null ? ("rejected" as const) : ("ok" as const),
    input: {
      source: input.source,
      lowColumn: input.lowColumn,
      highColumn: input.highColumn,
      dateColumn: input.dateColumn,
      riskFree: input.riskFree,
      units: input.units,
      frequency: input.frequency === null ? null : { name: input.frequency.name, periodsPerYear: input.frequency.periodsPerYear },
    },
    window:
      meta.spec.kind === "window"
        ? { kind: "window" as const, size: meta.spec.size, step: meta.spec.step, align: meta.spec.align ?? "end" }
        : { kind: "expanding" as const, minPeriods: meta.spec.minPeriods, step: meta.spec.step, align: meta.spec.align ?? "end" },
    start: meta.dates[window.start] ?? "",
    end: meta.dates[window.end] ?? "",
    observations: window.observations,
    weight: meta.weight,
    moments: momentsFromSummary(window.summary),
    capm: window.capm,
    bounds: window.bounds,
    landmarks: window.landmarks,
    diagnostics: [...meta.inputWarnings, ...window.diagnostics],
    uncertainty,
  };
  assertJsonSafe(record);
  return record;
}

/** The text table: one line per window with the CAPM beta and the set of the low structural beta. */
export function rollTextLines(
  meta: RollMeta,
  windows: Iterable<WindowSolution>,
  uncertaintyAt: (window: WindowSolution) => WindowUncertainty | null,
  style: Style,
  intervals: boolean,
): string[] {
  const spec =
    meta.spec.kind === "window"
      ? `${meta.spec.size} periods, every ${meta.spec.step}`
      : `expanding from ${meta.spec.minPeriods} periods, every ${meta.spec.step}`;
  // Rows are made as the windows come (the windows themselves are not kept: a million of them would
  // hold gigabytes).
  let confidence = defaultConfidence;
  const rows: string[][] = [];
  for (const w of windows) {
    const u = uncertaintyAt(w);
    if (u !== null) confidence = u.confidence;
    rows.push([
      meta.dates[w.end] ?? "",
      String(w.observations),
      formatNumber(w.capm?.low.beta ?? null, 4),
      formatNumber(w.bounds?.lowBeta.min ?? null, 4),
      formatNumber(w.bounds?.lowBeta.max ?? null, 4),
      w.bounds === null ? "no set" : formatNumber(w.bounds.lowBeta.max - w.bounds.lowBeta.min, 3),
      w.landmarks?.returnImplied === null || w.landmarks === null ? "n/a" : formatNumber(w.landmarks.returnImplied.lowBeta, 4),
      ...(!intervals
        ? []
        : [
            u === null ? "n/a" : `${formatNumber(u.lowBeta.interval.lower, 4)} to ${formatNumber(u.lowBeta.interval.upper, 4)}`,
            u?.pricing?.pValue == null ? "n/a" : formatNumber(u.pricing.pValue, 3),
            u?.pricing?.verdict ?? "n/a",
          ]),
    ]);
  }
  const level = `${Number((confidence * 100).toPrecision(4))}%`;
  const header = [
    "window end",
    "n",
    "CAPM\nlow beta",
    "low beta\nmin",
    "low beta\nmax",
    "width",
    "return-\nimplied",
    ...(intervals ? [`${level} interval\nfor low beta`, "noise explains\nalpha: p", "verdict"] : []),
  ];
  return [
    style.heading(`${meta.tool.name} ${meta.tool.version}: the identified set through time`),
    "",
    ...fields([
      ["File", meta.input.source],
      ["Books", `low "${meta.input.lowColumn}", high "${meta.input.highColumn}" (w = ${meta.weight})`],
      ["Windows", `${rows.length}: ${spec}`],
    ]),
    "",
    ...table({ header, rows }),
    "",
    `${indent}Statistical estimates under the one-factor model's assumptions, not investment advice.`,
  ];
}
