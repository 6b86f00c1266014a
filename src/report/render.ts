/** Picks the renderer for a format. */
import { renderCsv } from "./csv.js";
import { renderJson } from "./json.js";
import { renderText } from "./text/text.js";
import type { RenderOptions, ReportFormat, SolveReport } from "./types.js";

const renderers: Record<ReportFormat, (report: SolveReport, options: RenderOptions) => string> = {
  text: renderText,
  json: renderJson,
  csv: renderCsv,
};

export function renderReport(report: SolveReport, format: ReportFormat, options: RenderOptions): string {
  return renderers[format](report, options);
}
