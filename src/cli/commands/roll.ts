/**
 * `betabound roll`: the roll job (src/jobs/rollJob.ts) on the files and options of the command line.
 * CSV comes from typed-array columns and JSON Lines from one window at a time, both streamed to the
 * output, so a million windows fit in memory; records from several pairs (or shards) concatenate.
 */
import { Command } from "commander";
import type { WindowSolution } from "../../core/rolling/index.js";
import { type RolledPair, type RollJob, rollJob, runShape } from "../../jobs/index.js";
import type { CommandOptionsInput } from "../../options/index.js";
import { styleFor } from "../../report/layout.js";
import { rollChartPoints, rollCsvHeader, rollTextLines, windowWords, writeRollCsv } from "../../report/rollReport.js";
import { addTableOptions } from "../commandOptions.js";
import { withConfig } from "../config.js";
import { usage, waitsOnTerminal, wantsColour } from "../emit.js";
import { jobContext } from "../jobContext.js";
import { describeCliIssue, describeOptionIssue } from "../messages.js";
import { type ExitCode, exitCodes } from "../runtime/exitCodes.js";
import type { CliIo, OutputSink } from "../runtime/io.js";

export async function runRoll(files: readonly string[], flags: Readonly<Record<string, unknown>>, io: CliIo): Promise<ExitCode> {
  const job = rollJob(files, flags as CommandOptionsInput<"roll">, jobContext(io));
  if (!job.ok) return usage(io, describeOptionIssue(job.issues));
  const { options, several } = job.value;
  if (waitsOnTerminal(io, files, runShape(files, options))) return usage(io, describeCliIssue({ code: "no-input" }));
  const sink = io.openSink(options.output);
  if (!sink.ok) {
    io.writeErr(`error: ${describeCliIssue(sink.issues)}\n`);
    return exitCodes.output;
  }
  const codes: ExitCode[] = [];
  if (options.format === "csv") sink.value.write(rollCsvHeader(options.uncertainty));
  for await (const pair of job.value.pairs) {
    for (const message of pair.messages) io.writeErr(`${message.severity}: ${message.text}\n`);
    if (pair.kind === "failure") {
      if (options.format === "jsonl" && pair.document !== null) sink.value.write(`${JSON.stringify(pair.document)}\n`);
      codes.push(exitCodes.input);
    } else codes.push(await writePair(pair, job.value, sink.value, io));
  }
  const closed = sink.value.close();
  if (!closed.ok) {
    io.writeErr(`error: ${describeCliIssue(closed.issues)}\n`);
    return exitCodes.output;
  }
  if (!several) return codes[0] ?? exitCodes.input;
  return codes.every((c) => c === exitCodes.ok) ? exitCodes.ok : exitCodes.partial;
}

async function writePair(pair: RolledPair, job: RollJob, sink: OutputSink, io: CliIo): Promise<ExitCode> {
  const { options } = job;
  const { meta } = pair;
  const chart = options.chart !== undefined;
  let kept: WindowSolution[] = [];
  if (options.format === "csv") {
    const listed = options.uncertainty || chart ? [...pair.windows()] : [];
    const uncertainty = options.uncertainty ? (k: number) => pair.uncertaintyAt(listed[k]!) : null;
    writeRollCsv(meta, pair.columns(), uncertainty, (text) => sink.write(text));
    kept = listed;
  } else if (options.format === "jsonl") {
    let chunk = "";
    for (const window of pair.windows()) {
      chunk += `${JSON.stringify(pair.record(window))}\n`;
      if (chunk.length > 1 << 20) {
        sink.write(chunk);
        chunk = "";
      }
      if (chart) kept.push(window);
    }
    sink.write(chunk);
  } else {
    kept = [...pair.windows()];
    const intervals = options.uncertainty ? kept.map((w) => pair.uncertaintyAt(w)) : null;
    const style = styleFor({ colour: wantsColour(io, options.output, options.format) });
    sink.write(`${rollTextLines(meta, kept, intervals, style).join("\n")}\n`);
  }
  if (!chart) return exitCodes.ok;
  const { renderRollChart } = await import("../../report/charts/rollChart.js");
  const points = rollChartPoints(meta, kept, (w) => pair.uncertaintyAt(w));
  const svg = await renderRollChart(points, { source: meta.input.source, window: windowWords(job.spec) }, io.loadVega);
  const written = await io.writeOutput(options.chart ?? "", svg);
  if (written.ok) return exitCodes.ok;
  io.writeErr(`error: ${describeCliIssue(written.issues)}\n`);
  return exitCodes.output;
}

const rollExamples = `
Examples:
  $ betabound roll returns.csv --low LOW --high HIGH --window 36
  $ betabound roll daily.csv --low LOW --high HIGH --window 252 --step 21 --format csv --output windows.csv
  $ betabound roll returns.csv --low LOW --high HIGH --expanding --min-periods 60 --format jsonl --uncertainty
  $ betabound roll returns.csv --low LOW --high HIGH --window 36 --chart band.svg
`;

export function rollCommand(io: CliIo, setExit: (code: ExitCode) => void): Command {
  const command = new Command("roll")
    .description("The identified set over rolling or expanding windows: how the bounds move through time.")
    .argument("[files...]", "CSV files of per-period returns, or '-' for standard input");
  return addTableOptions(command, "roll")
    .addHelpText("after", rollExamples)
    .action(async (given: string[], _raw: Record<string, unknown>, self: Command) => {
      const job = await withConfig(self, "roll", given, io);
      if (!job.ok) return setExit(usage(io, describeCliIssue(job.issues)));
      setExit(await runRoll(job.value.files, job.value.options, io));
    });
}
