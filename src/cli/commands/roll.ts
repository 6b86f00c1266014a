/**
 * `betabound roll`: the identified set over rolling or expanding windows, for every file and pair.
 * CSV comes from typed-array columns and JSON Lines from one window at a time, both streamed to the
 * output, so a million windows fit in memory; records from several pairs (or shards) concatenate.
 */
import { Command, Option } from "commander";
import { excessReturns } from "../../core/inference/bootstrap/replicates.js";
import { windowUncertainty, type WindowUncertainty } from "../../core/inference/windowUncertainty.js";
import { iterateRollSolve, rollSolveColumns, windowCount, type WindowSolution, type WindowSpec } from "../../core/rolling/rolling.js";
import { describeInputWarning } from "../../input/issues.js";
import { failureOutput } from "../../report/records.js";
import { rollCsvHeader, rollRecord, rollTextLines, writeRollCsv, type RollMeta } from "../../report/rollReport.js";
import { styleFor } from "../../report/layout.js";
import { openUnitInterval, wholeNumber } from "../arguments.js";
import { withConfig } from "../config.js";
import { usage, wantsColour } from "../emit.js";
import { exitCodes, type ExitCode } from "../runtime/exitCodes.js";
import { addInputOptions } from "../inputOptions.js";
import type { CliIo, OutputSink } from "../runtime/io.js";
import { describeCliIssue } from "../messages.js";
import {
  describeOptionIssue,
  longRunMethods,
  rollFormats,
  rollOptionsSchema,
  uncertaintyDefaults,
  type RollCliOptions,
} from "../options.js";
import { describeInput, joinedSides, loadPairs, sampleOf, type PairTable } from "../pairTables.js";
import { pairsFrom } from "../pairs.js";
import { version } from "../runtime/version.js";

const tool = { name: "betabound", version } as const;

export async function runRoll(files: readonly string[], options: RollCliOptions, io: CliIo): Promise<ExitCode> {
  const pairs = pairsFrom(options);
  const joined = joinedSides(files, options) !== null;
  if (!joined && files.length === 0 && io.stdinIsTerminal) return usage(io, describeCliIssue({ code: "no-input" }));
  const several = !joined && Math.max(files.length, 1) * pairs.length > 1;
  if (several && options.chart !== undefined) {
    return usage(
      io,
      describeCliIssue({
        code: "invalid-option",
        option: "--chart",
        value: options.chart,
        expected: "draws one file and one pair; run it per pair",
      }),
    );
  }
  const spec: WindowSpec = options.expanding
    ? { kind: "expanding", minPeriods: options.minPeriods ?? 3, step: options.step }
    : { kind: "window", size: options.window ?? 3, step: options.step };
  const sink = io.openSink(options.output);
  if (!sink.ok) {
    io.writeErr(`error: ${describeCliIssue(sink.issues)}\n`);
    return exitCodes.output;
  }
  const codes: ExitCode[] = [];
  const style = styleFor({ colour: wantsColour(io, options.output, options.format) });
  if (options.format === "csv") sink.value.write(rollCsvHeader(options.uncertainty));
  for await (const load of loadPairs(files, pairs, options, io)) {
    if (!load.ok) {
      for (const e of load.errors) io.writeErr(`error: ${e.message}\n`);
      if (options.format === "jsonl") {
        const failure = failureOutput({
          tool,
          source: load.source,
          lowColumn: load.pair.low,
          highColumn: load.pair.high,
          errors: load.errors,
        });
        sink.value.write(`${JSON.stringify(failure)}\n`);
      }
      codes.push(exitCodes.input);
      continue;
    }
    for (const w of load.value.table.warnings) io.writeErr(`warning: ${describeInputWarning(w)}\n`);
    codes.push(await rollPair(load.value, spec, options, sink.value, style, io));
  }
  const closed = sink.value.close();
  if (!closed.ok) {
    io.writeErr(`error: ${describeCliIssue(closed.issues)}\n`);
    return exitCodes.output;
  }
  if (!several) return codes[0] ?? exitCodes.input;
  return codes.every((c) => c === exitCodes.ok) ? exitCodes.ok : exitCodes.partial;
}

async function rollPair(
  loaded: PairTable,
  spec: WindowSpec,
  options: RollCliOptions,
  sink: OutputSink,
  style: ReturnType<typeof styleFor>,
  io: CliIo,
): Promise<ExitCode> {
  const sample = sampleOf(loaded);
  const n = sample.low.length;
  if (windowCount(n, spec) === 0) {
    const needed = spec.kind === "window" ? spec.size : spec.minPeriods;
    io.writeErr(
      `error: ${loaded.source}: ${n} aligned rows are fewer than the ${needed} the first window needs; use a shorter --window or --min-periods\n`,
    );
    return exitCodes.input;
  }
  const meta: RollMeta = { tool, input: describeInput(loaded, options), spec, weight: options.weight, dates: loaded.table.dates };
  const excess = excessReturns({ ...sample, weight: options.weight });
  const uncertaintyAt = (w: { start: number; end: number; summary: WindowSolution["summary"] }): WindowUncertainty | null =>
    options.uncertainty
      ? windowUncertainty(excess.low, excess.high, w.start, w.end, w.summary, { confidence: options.confidence, longRun: options.longRun })
      : null;

  let points: WindowSolution[] | null = null;
  if (options.format === "csv") {
    const columns = rollSolveColumns(sample.low, sample.high, sample.riskFree, options.weight, spec);
    const summaries = options.uncertainty ? [...iterateRollSolve(sample.low, sample.high, sample.riskFree, options.weight, spec)] : null;
    writeRollCsv(meta, columns, summaries === null ? null : (k) => uncertaintyAt(summaries[k]!), (text) => sink.write(text));
    if (options.chart !== undefined)
      points = summaries ?? [...iterateRollSolve(sample.low, sample.high, sample.riskFree, options.weight, spec)];
  } else if (options.format === "jsonl") {
    let chunk = "";
    const kept: WindowSolution[] = [];
    for (const window of iterateRollSolve(sample.low, sample.high, sample.riskFree, options.weight, spec)) {
      chunk += `${JSON.stringify(rollRecord(meta, window, uncertaintyAt(window)))}\n`;
      if (chunk.length > 1 << 20) {
        sink.write(chunk);
        chunk = "";
      }
      if (options.chart !== undefined) kept.push(window);
    }
    sink.write(chunk);
    points = options.chart === undefined ? null : kept;
  } else {
    const windows = [...iterateRollSolve(sample.low, sample.high, sample.riskFree, options.weight, spec)];
    const intervals = options.uncertainty ? windows.map(uncertaintyAt) : null;
    sink.write(`${rollTextLines(meta, windows, intervals, style).join("\n")}\n`);
    points = windows;
  }
  if (options.chart !== undefined && points !== null) {
    const { renderRollChart } = await import("../../report/charts/rollChart.js");
    const windowWords =
      spec.kind === "window" ? `rolling windows of ${spec.size} periods` : `expanding windows from ${spec.minPeriods} periods`;
    const svg = await renderRollChart(
      points.map((w) => {
        const u = uncertaintyAt(w);
        return {
          end: meta.dates[w.end] ?? "",
          lowBetaMin: w.bounds?.lowBeta.min ?? null,
          lowBetaMax: w.bounds?.lowBeta.max ?? null,
          capmLowBeta: w.capm?.low.beta ?? Number.NaN,
          ...(u === null ? {} : { interval: { lower: u.lowBeta.interval.lower, upper: u.lowBeta.interval.upper } }),
        };
      }),
      { source: loaded.source, window: windowWords },
    );
    const written = await io.writeOutput(options.chart, svg);
    if (!written.ok) {
      io.writeErr(`error: ${describeCliIssue(written.issues)}\n`);
      return exitCodes.output;
    }
  }
  return exitCodes.ok;
}

const rollExamples = `
Examples:
  $ betabound roll returns.csv --low LOW --high HIGH --window 36
  $ betabound roll daily.csv --low LOW --high HIGH --window 252 --step 21 --format csv --output windows.csv
  $ betabound roll returns.csv --low LOW --high HIGH --expanding --min-periods 60 --format jsonl --uncertainty
  $ betabound roll returns.csv --low LOW --high HIGH --window 36 --chart band.svg
`;

export function rollCommand(io: CliIo, setExit: (code: ExitCode) => void): Command {
  const command = addInputOptions(
    new Command("roll")
      .description("The identified set over rolling or expanding windows: how the bounds move through time.")
      .argument("[files...]", "CSV files of per-period returns, or '-' for standard input"),
  );
  return command
    .option("--window <n>", "rolling window length in periods", wholeNumber(3, 100_000_000))
    .option("--step <k>", "periods between consecutive windows", wholeNumber(1, 100_000_000), 1)
    .option("--expanding", "expanding windows from the first row instead of a rolling window", false)
    .option("--min-periods <n>", "with --expanding: the first window's length", wholeNumber(3, 100_000_000))
    .addOption(
      new Option("--format <format>", "output format (csv: one row per window; jsonl: one record per window)")
        .choices(rollFormats)
        .default("text"),
    )
    .option("--uncertainty", "delta-method standard errors of the bounds and an interval for the low beta in every window", false)
    .option("--confidence <level>", "confidence level with --uncertainty", openUnitInterval, uncertaintyDefaults.confidence)
    .addOption(
      new Option("--long-run <method>", "long-run covariance for --uncertainty")
        .choices(longRunMethods)
        .default(uncertaintyDefaults.longRun),
    )
    .option("--chart <file.svg>", "also draw the band of the low beta's bounds through time")
    .option("--config <file>", "JSON file with files, pairs and options for a job; flags override it")
    .addHelpText("after", rollExamples)
    .action(async (given: string[], _raw: Record<string, unknown>, self: Command) => {
      const job = await withConfig(self, given, io);
      if (!job.ok) return setExit(usage(io, describeCliIssue(job.issues)));
      const parsed = rollOptionsSchema().safeParse(job.value.options);
      if (!parsed.success) return setExit(usage(io, describeOptionIssue(parsed.error)));
      setExit(await runRoll(job.value.files, parsed.data, io));
    });
}
