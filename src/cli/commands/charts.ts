/**
 * `--chart` and `--report` for one solved record: the identified set's chart, or with `--portfolios`
 * the factor model's (loadings against CAPM betas); the HTML report holds every chart drawn. The
 * chart modules (and vega behind them) are imported only here, when a chart is asked for, so plain
 * runs never load them.
 */
import type { CommandOptions } from "../../options/index.js";
import type { SolveReport } from "../../report/types.js";
import { describeCliIssue } from "../messages.js";
import { type ExitCode, exitCodes } from "../runtime/exitCodes.js";
import { type CliIo, writeOutput } from "../runtime/io.js";

/** What solve's options ask to draw. */
export type ChartRequest = Pick<CommandOptions<"solve">, "chart" | "chartY" | "report">;

/** Renders and writes the requested chart and HTML report; returns the exit code of the writing. */
export async function writeCharts(report: SolveReport, request: ChartRequest, io: CliIo): Promise<ExitCode> {
  if (request.chart === undefined && request.report === undefined) return exitCodes.ok;
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
  if (request.chart !== undefined) {
    const written = await writeOutput(io, request.chart, factor ?? svg);
    if (!written.ok) return fail(io, written.issues);
  }
  if (request.report !== undefined) {
    const { renderHtmlReport } = await import("../../report/charts/htmlReport.js");
    const charts = factor === undefined ? { identifiedSet: svg } : { identifiedSet: svg, factor };
    const written = await writeOutput(io, request.report, renderHtmlReport(report, charts));
    if (!written.ok) return fail(io, written.issues);
  }
  return exitCodes.ok;
}

function fail(io: CliIo, issue: Parameters<typeof describeCliIssue>[0]): ExitCode {
  io.writeErr(`error: ${describeCliIssue(issue)}\n`);
  return exitCodes.output;
}
