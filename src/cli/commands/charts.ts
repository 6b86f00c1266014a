/**
 * `--chart` and `--report` for one solved record: the identified set's chart, or with `--portfolios`
 * the factor model's (loadings against CAPM betas); the HTML report holds every chart drawn. The
 * chart modules (and vega behind them) are imported only here, when a chart is asked for, so plain
 * runs never load them.
 */
import type { CommandOptions } from "../../options/index.js";
import type { SolveReport } from "../../report/types.js";
import type { CliIo, OutputItem } from "../runtime/io.js";

/** What solve's options ask to draw. */
export type ChartRequest = Pick<CommandOptions<"solve">, "chart" | "chartY" | "report">;

/**
 * Renders the requested chart and HTML report: the outputs to write (none when neither is asked for),
 * written with the run's other output as one (io.ts, writeOutputs).
 */
export async function drawCharts(report: SolveReport, request: ChartRequest, io: CliIo): Promise<OutputItem[]> {
  if (request.chart === undefined && request.report === undefined) return [];
  const { renderIdentifiedSetChart } = await import("../../report/charts/identifiedSetChart.js");
  const u = report.uncertainty;
  const uncertainty =
    u === null || u.bounds === null || u.lowBeta === null
      ? undefined
      : {
          lowBetaInterval: { lower: u.lowBeta.interval.lower, upper: u.lowBeta.interval.upper },
          boundIntervals: {
            min: { lower: u.bounds.lowBeta.min.lower, upper: u.bounds.lowBeta.min.upper },
            max: { lower: u.bounds.lowBeta.max.lower, upper: u.bounds.lowBeta.max.upper },
          },
          confidence: u.confidence,
        };
  const svg = await renderIdentifiedSetChart(
    report,
    { y: request.chartY, ...(uncertainty === undefined ? {} : { uncertainty }) },
    io.loadVega,
  );
  // With --portfolios the chart file holds the factor model's chart; the HTML report holds both.
  const factor =
    report.factorModel === null
      ? undefined
      : await (await import("../../report/charts/factorChart.js")).renderFactorChart(
          report.factorModel,
          u === null ? {} : { confidence: u.confidence },
          io.loadVega,
        );
  const items: OutputItem[] = [];
  if (request.chart !== undefined) items.push({ path: request.chart, text: factor ?? svg });
  if (request.report !== undefined) {
    const { renderHtmlReport } = await import("../../report/charts/htmlReport.js");
    const charts = factor === undefined ? { identifiedSet: svg } : { identifiedSet: svg, factor };
    items.push({ path: request.report, text: renderHtmlReport(report, charts) });
  }
  return items;
}
