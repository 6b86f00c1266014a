/**
 * Reports for `implied`: what a structure implies, with the same field names as `solve` so a script can
 * compare the two. JSON: { schemaVersion, tool, command: "implied", structure, truth, weight, moments,
 * capm, bounds, grid, landmarks, diagnostics, conventions }; CSV: the candidate columns of `solve`'s
 * grid with a `truth` row first; text: the structure, population moments and CAPM values, then the
 * same set sections as `solve`.
 */

import type { ImpliedSolution } from "../core/forward/implied.js";
import { modelAssumptions } from "./conventions.js";
import { candidateCsv, namedCandidates } from "./csv.js";
import { formatNumber } from "./format.js";
import { assertJsonSafe, schemaVersion } from "./json.js";
import { fields, indent, styleFor, table, wrap } from "./layout.js";
import { momentsSection } from "./text/textData.js";
import { assumptionsSection, cautionLine, diagnosticsSection } from "./text/textNotes.js";
import { boundsSection, gridSection, landmarksSection, rejectedSection } from "./text/textSet.js";
import type { ImpliedOutputJson } from "../schema/impliedOutput.js";
import type { RenderOptions, ReportFormat, SolveReport } from "./types.js";

export interface ImpliedReport {
  readonly tool: SolveReport["tool"];
  readonly solution: ImpliedSolution;
  /** Risk-free return per period: raw expected returns are rf + b * factorMean. Default 0. */
  readonly riskFree?: number;
}

export function impliedOutput(report: ImpliedReport): ImpliedOutputJson {
  const s = report.solution;
  return {
    schemaVersion,
    tool: { name: report.tool.name, version: report.tool.version },
    command: "implied" as const,
    structure: s.structure,
    riskFree: report.riskFree ?? 0,
    expectedReturns: {
      low: (report.riskFree ?? 0) + s.moments.low.mean,
      high: (report.riskFree ?? 0) + s.moments.high.mean,
      market: (report.riskFree ?? 0) + s.moments.market.mean,
    },
    truth: s.truth,
    weight: s.weight,
    moments: s.moments,
    capm: s.capm,
    bounds: s.bounds,
    grid: s.grid,
    landmarks: s.landmarks,
    diagnostics: s.diagnostics,
    conventions: {
      units: "decimal, per period" as const,
      moments: "population (no sampling error)" as const,
      marketProxy: "M = w low + (1 - w) high" as const,
      marketProxyWeight: s.weight,
      normalisation: "w b_low + (1 - w) b_high = 1" as const,
      assumptions: [...modelAssumptions],
    },
  };
}

function renderImpliedJson(report: ImpliedReport): string {
  const output = impliedOutput(report);
  assertJsonSafe(output);
  return `${JSON.stringify(output, null, 2)}\n`;
}

function renderImpliedCsv(report: ImpliedReport): string {
  const s = report.solution;
  return candidateCsv([["truth", s.truth], ...(s.bounds === null ? [] : namedCandidates(s.grid, s.landmarks))]);
}

function renderImpliedText(report: ImpliedReport, options: RenderOptions): string {
  const style = styleFor(options);
  const s = report.solution;
  const st = s.structure;
  const position =
    s.bounds === null || s.bounds.lowBeta.max === s.bounds.lowBeta.min
      ? null
      : (st.lowBeta - s.bounds.lowBeta.min) / (s.bounds.lowBeta.max - s.bounds.lowBeta.min);
  const sections: string[][] = [
    [style.heading(`${report.tool.name} ${report.tool.version}: what a structure implies (population values, no sampling error)`)],
    [
      style.heading("Structure (per period, decimal)"),
      ...fields([
        ["low structural beta", formatNumber(st.lowBeta)],
        ["high structural beta", formatNumber(s.truth.highBeta)],
        ["factor sd / variance", `${formatNumber(st.factorVol)} / ${formatNumber(s.truth.factorVariance)}`],
        ["factor mean excess return", formatNumber(st.factorMean)],
        ["low noise sd / variance", `${formatNumber(st.lowNoiseVol)} / ${formatNumber(s.truth.lowNoiseVariance)}`],
        ["high noise sd / variance", `${formatNumber(st.highNoiseVol)} / ${formatNumber(s.truth.highNoiseVariance)}`],
        ["market proxy weight w", String(st.weight)],
        ["risk-free return", formatNumber(report.riskFree ?? 0)],
        [
          "expected raw returns",
          `low ${formatNumber((report.riskFree ?? 0) + s.moments.low.mean)}, high ${formatNumber((report.riskFree ?? 0) + s.moments.high.mean)}`,
        ],
      ]),
    ],
    momentsSection(s, style, "Population moments (excess returns, per period)"),
    [
      style.heading("CAPM regressions on the market proxy (population)"),
      ...table({
        header: ["", "low", "high"],
        rows: [
          ["expected alpha", formatNumber(s.capm.low.alpha), formatNumber(s.capm.high.alpha)],
          ["beta", formatNumber(s.capm.low.beta), formatNumber(s.capm.high.beta)],
          ["R-squared", formatNumber(s.capm.low.rSquared), formatNumber(s.capm.high.rSquared)],
          ["residual variance", formatNumber(s.capm.low.residualVariance), formatNumber(s.capm.high.residualVariance)],
        ],
      }),
    ],
  ];
  if (s.bounds === null) sections.push(rejectedSection(s.diagnostics.find((d) => d.severity === "error")?.message ?? null, style));
  else {
    sections.push(boundsSection(s.bounds, style));
    if (position !== null) {
      const where = `The true low structural beta sits ${formatNumber(position * 100, 3)}% of the way from the lower to the upper bound; a sample cannot tell it from any other point of the set.`;
      sections.push(wrap(where, indent, indent));
    }
    if (s.landmarks !== null) sections.push(landmarksSection(s.landmarks, style));
    sections.push(gridSection(s, style));
  }
  sections.push(diagnosticsSection(s.diagnostics, style), assumptionsSection(s.weight, style), wrap(cautionLine, "", ""));
  return `${sections.map((lines) => lines.join("\n")).join("\n\n")}\n`;
}

export function renderImplied(report: ImpliedReport, format: ReportFormat, options: RenderOptions): string {
  switch (format) {
    case "json":
      return renderImpliedJson(report);
    case "csv":
      return renderImpliedCsv(report);
    case "text":
      return renderImpliedText(report, options);
  }
}
