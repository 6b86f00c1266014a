/**
 * `betabound roll`: the roll job (src/jobs/rollJob.ts) on the files and options of the command line.
 * CSV comes from typed-array columns and JSON Lines from one window at a time, both streamed to the
 * output, so a million windows fit in memory; records from several pairs (or shards) concatenate.
 */
import { Command } from "commander";
import { type WindowSolution, windowCount } from "../../core/rolling/index.js";
import { type RolledPair, type RollJob, rollJob, runShape } from "../../jobs/index.js";
import type { CommandOptionsInput } from "../../options/index.js";
import { styleFor } from "../../report/layout.js";
import type { WindowUncertainty } from "../../core/inference/windowUncertainty.js";
import type { RollWindowPoint } from "../../report/charts/rollChart.js";
import { rollCsvHeader, writeRollCsv } from "../../report/rollCsv.js";
import { rollChartPoint, rollRecord, rollTextLines, windowWords } from "../../report/rollReport.js";
import { addTableOptions } from "../commandOptions.js";
import { withConfig } from "../config.js";
import { outputFailed, usage, waitsOnTerminal, wantsColour } from "../emit.js";
import { jobContext } from "../jobContext.js";
import { writeMessages } from "../jobMessages.js";
import { describeCliIssue, describeOptionIssue } from "../messages.js";
import { type ExitCode, exitCodes } from "../runtime/exitCodes.js";
import { rollCsvThreadsPay, writeRollCsvThreaded } from "../runtime/rollCsvThreads.js";
import type { CliIo, OutputTarget } from "../runtime/io.js";
import { outputClash } from "../outputPaths.js";

export async function runRoll(
  files: readonly string[],
  flags: Readonly<Record<string, unknown>>,
  io: CliIo,
  configFile?: string,
): Promise<ExitCode> {
  const job = rollJob(files, flags as CommandOptionsInput<"roll">, jobContext(io));
  if (!job.ok) return usage(io, describeOptionIssue(job.issues));
  const { options, several } = job.value;
  const shape = runShape(files, options);
  if (waitsOnTerminal(io, files, shape)) return usage(io, describeCliIssue({ code: "no-input" }));
  const clash = outputClash(io, configFile === undefined ? shape.reads : [...shape.reads, configFile], options);
  if (clash !== null) return usage(io, describeCliIssue(clash));
  // Nothing is written, to a file or to standard output, before a pair has been read and solved:
  // failure records wait for the first success (a run where every pair fails writes nothing).
  let target: OutputTarget | null = null;
  // The chart's file is opened with the output, before anything is written (a folder missing fails
  // the run before standard output has a line), and renamed over its target after the output's commit.
  let chart: OutputTarget | null = null;
  const waiting: string[] = [];
  const codes: ExitCode[] = [];
  const seen = new Set<string>();
  try {
    for await (const pair of job.value.pairs) {
      writeMessages(io, pair.messages, seen);
      if (pair.kind === "failure") {
        const record = options.format === "jsonl" && pair.document !== null ? `${JSON.stringify(pair.document)}\n` : "";
        if (target === null) waiting.push(record);
        else await target.write(record);
        codes.push(exitCodes.input);
        continue;
      }
      if (target === null) {
        if (options.chart !== undefined) {
          const chartOpened = io.openOutput(options.chart);
          if (!chartOpened.ok) return outputFailed(io, chartOpened.issues);
          chart = chartOpened.value;
        }
        const opened = io.openOutput(options.output);
        if (!opened.ok) return outputFailed(io, opened.issues);
        // The header and waiting records go out with the first windows (a reader sees a whole row).
        const lead = (options.format === "csv" ? rollCsvHeader(options.uncertainty) : "") + waiting.join("");
        target = leading(opened.value, lead);
      }
      codes.push(await writePair(pair, job.value, target, chart, io));
    }
    if (target !== null) {
      const chartReady = chart === null ? null : await chart.settle();
      if (chartReady !== null && !chartReady.ok) return outputFailed(io, chartReady.issues);
      const committed = await target.commit();
      if (!committed.ok) return outputFailed(io, committed.issues);
      const chartCommitted = chart === null ? null : await chart.commit();
      if (chartCommitted !== null && !chartCommitted.ok) return outputFailed(io, chartCommitted.issues);
    }
  } finally {
    target?.abort();
    chart?.abort();
  }
  if (!several) return codes[0] ?? exitCodes.input;
  if (codes.every((c) => c === exitCodes.input)) return exitCodes.input;
  return codes.every((c) => c === exitCodes.ok) ? exitCodes.ok : exitCodes.partial;
}

/** `target` with `lead` written before the first text written to it. */
function leading(target: OutputTarget, lead: string): OutputTarget {
  let first = lead;
  const flushLead = async (): Promise<void> => {
    if (first === "") return;
    const text = first;
    first = "";
    await target.write(text);
  };
  return {
    ...target,
    write(text) {
      if (first === "") return target.write(text);
      const whole =
        typeof text === "string" ? first + text : text instanceof Uint8Array ? Buffer.concat([Buffer.from(first), text]) : [first, ...text];
      first = "";
      return target.write(whole);
    },
    async settle() {
      await flushLead();
      return target.settle();
    },
    async commit() {
      await flushLead();
      return target.commit();
    },
  };
}

/** Windows a block of the CSV's columns (a megabyte of numbers). */
const csvBlockWindows = 4096;

/**
 * Writes one pair's windows in the asked format; with --chart, also its chart. The windows are
 * computed as they are written and never kept (a million of them would hold gigabytes); the chart
 * keeps one small point per window.
 */
async function writePair(pair: RolledPair, job: RollJob, target: OutputTarget, chart: OutputTarget | null, io: CliIo): Promise<ExitCode> {
  const { options } = job;
  const { meta } = pair;
  const points: RollWindowPoint[] | null = options.chart === undefined ? null : [];
  // Each window's uncertainty (null without --uncertainty), noting its chart point on the way.
  const seen = (window: WindowSolution): WindowUncertainty | null => {
    const u = pair.uncertaintyAt(window);
    points?.push(rollChartPoint(meta, window, u));
    return u;
  };
  if (options.format === "csv") {
    // The columns come from the scan's typed arrays; the window objects only when needed, in step.
    const walk = options.uncertainty || points !== null ? pair.windows()[Symbol.iterator]() : null;
    const next = (): WindowUncertainty | null => (walk === null ? null : seen(walk.next().value as WindowSolution));
    const blocks = pair.columnBlocks(csvBlockWindows); // one block's arrays, reused: no fresh memory per window
    const write = (bytes: Uint8Array) => target.write(bytes);
    const { stamps } = meta;
    if (!options.uncertainty && stamps !== undefined && rollCsvThreadsPay(windowCount(stamps.keys.length, job.spec)))
      await writeRollCsvThreaded(meta, stamps, blocks, csvBlockWindows, write);
    else await writeRollCsv(meta, blocks, options.uncertainty ? next : null, write);
    if (!options.uncertainty && walk !== null) for (let w = walk.next(); !w.done; w = walk.next()) seen(w.value);
  } else if (options.format === "jsonl") {
    let chunk = "";
    for (const window of pair.windows()) {
      chunk += `${JSON.stringify(rollRecord(meta, window, seen(window)))}\n`;
      if (chunk.length > 1 << 20) {
        await target.write(chunk);
        chunk = "";
      }
    }
    await target.write(chunk);
  } else {
    const style = styleFor({ colour: wantsColour(io, options.output, options.format) });
    const lines = rollTextLines(meta, pair.windows(), seen, style, options.uncertainty);
    for (let k = 0; k < lines.length; k += 10_000) await target.write(`${lines.slice(k, k + 10_000).join("\n")}\n`);
  }
  if (points === null || chart === null) return exitCodes.ok;
  const { renderRollChart } = await import("../../report/charts/rollChart.js");
  await chart.write(await renderRollChart(points, { source: meta.input.source, window: windowWords(job.spec) }, io.loadVega));
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
  const command = new Command("roll")
    .description("The identified set over rolling or expanding windows: how the bounds move through time.")
    .argument("[files...]", "CSV files of per-period returns, or '-' for standard input");
  return addTableOptions(command, "roll")
    .addHelpText("after", rollExamples)
    .action(async (given: string[], _raw: Record<string, unknown>, self: Command) => {
      const job = await withConfig(self, "roll", given, io);
      if (!job.ok) return setExit(usage(io, describeCliIssue(job.issues)));
      setExit(await runRoll(job.value.files, job.value.options, io, job.value.configFile));
    });
}
