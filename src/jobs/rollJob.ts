/**
 * The roll job: the identified set over rolling or expanding windows, for every (file, pair). Nothing
 * is held whole: each pair offers its windows as an iterator (computed in amortised O(1) each), as
 * typed-array columns (for CSV), and as the JSON records `roll --format jsonl` writes, one at a time.
 */
import { fiellerCriticalValue } from "../core/landmarks.js";
import { largestValues, magnitudeIssue } from "../core/cancellation.js";
import { describeDiagnostic } from "../core/diagnostics.js";
import { excessReturns } from "../core/inference/bootstrap/replicates.js";
import { type WindowUncertainty, windowUncertainty } from "../core/inference/windowUncertainty.js";
import { failure, type Result, success } from "../core/result.js";
import {
  iterateRollSolve,
  rollSolveColumnBlocks,
  rollSolveColumns,
  type WindowColumns,
  type WindowSolution,
  type WindowSpec,
  windowCount,
} from "../core/rolling/index.js";
import { inputWarningDiagnostic } from "../input/index.js";
import { type CommandOptions, type CommandOptionsInput, type OptionIssue, parseOptions } from "../options/index.js";
import { failureOutput } from "../report/records.js";
import { type RollMeta, rollRecord } from "../report/rollReport.js";
import type { RollOutputJson } from "../schema/rollOutput.js";
import type { SolveFailureJson } from "../schema/solveOutput.js";
import type { JobContext } from "./context.js";
import { describeInput, loadPairs, type PairTable, readErrorMessages, readingMessages, runShape, sampleOf } from "./pairTables.js";
import { pairsFrom } from "./pairs.js";
import type { JobMessage } from "./solveJob.js";
import { tool } from "./tool.js";

/** The windows of one (file, pair). */
export interface RolledPair {
  readonly kind: "windows";
  readonly meta: RollMeta;
  readonly messages: readonly JobMessage[];
  /** Every window in order, computed as it is reached. */
  windows(): Iterable<WindowSolution>;
  /** Every window as typed-array columns (the CSV's numbers). */
  columns(): WindowColumns;
  /** The same columns `blockSize` windows at a time, in reused arrays (rollSolveColumnBlocks). */
  columnBlocks(blockSize: number): Iterable<WindowColumns>;
  /** A window's standard errors and interval (null without `uncertainty`, or when the window has no set). */
  uncertaintyAt(window: WindowSolution): WindowUncertainty | null;
  /** The JSON record of a window: one `roll --format jsonl` line. */
  record(window: WindowSolution): RollOutputJson;
  /** The JSON record of every window, in order. */
  records(): Iterable<RollOutputJson>;
}

/**
 * A (file, pair) that was not rolled: its errors (stable codes), and its failure record (null for a
 * pair too short for one window, which writes none).
 */
export interface RollFailure {
  readonly kind: "failure";
  readonly errors: readonly { readonly code: string; readonly message: string }[];
  readonly document: SolveFailureJson | null;
  readonly messages: readonly JobMessage[];
}

export interface RollJob {
  readonly options: CommandOptions<"roll">;
  readonly spec: WindowSpec;
  readonly several: boolean;
  /** The pairs in order, each read when it is reached. */
  readonly pairs: AsyncIterable<RolledPair | RollFailure>;
}

/** Validates `input` (filling in defaults) and plans the windows; the pairs are read as they are iterated. */
export function rollJob(files: readonly string[], input: CommandOptionsInput<"roll">, context: JobContext): Result<RollJob, OptionIssue> {
  const parsed = parseOptions("roll", input);
  if (!parsed.ok) return parsed;
  const options = parsed.value;
  const { several } = runShape(files, options);
  if (several && options.chart !== undefined) {
    return failure({
      code: "options-conflict",
      option: "chart",
      value: options.chart,
      message: "draws one file and one pair; run it per pair",
    });
  }
  const spec = windowSpecOf(options);
  return success({ options, spec, several, pairs: rollPairs(files, options, spec, context) });
}

/** The windows the options ask for (the rules across options have made sure the sizes are there). */
function windowSpecOf(options: CommandOptions<"roll">): WindowSpec {
  const first = options.expanding ? options.minPeriods : options.window;
  if (first === undefined) throw new Error("rollJob: the window size passed validation without a value");
  return options.expanding
    ? { kind: "expanding", minPeriods: first, step: options.step, align: options.align }
    : { kind: "window", size: first, step: options.step, align: options.align };
}

async function* rollPairs(
  files: readonly string[],
  options: CommandOptions<"roll">,
  spec: WindowSpec,
  context: JobContext,
): AsyncGenerator<RolledPair | RollFailure> {
  for await (const load of loadPairs(files, pairsFrom(options), options, context.read)) {
    if (!load.ok) {
      const document = failureOutput({
        tool,
        source: load.source,
        lowColumn: load.pair.low,
        highColumn: load.pair.high,
        errors: load.errors,
      });
      yield { kind: "failure", errors: load.errors, document, messages: readErrorMessages(load.errors) };
    } else yield rollPair(load.value, options, spec);
  }
}

function rollPair(loaded: PairTable, options: CommandOptions<"roll">, spec: WindowSpec): RolledPair | RollFailure {
  const inputWarnings = loaded.table.warnings.map(inputWarningDiagnostic);
  const warnings: JobMessage[] = readingMessages(inputWarnings);
  const sample = sampleOf(loaded);
  const n = sample.low.length;
  if (windowCount(n, spec) === 0) {
    const needed = spec.kind === "window" ? spec.size : spec.minPeriods;
    const text = `${loaded.source}: ${n} aligned rows are fewer than the ${needed} the first window needs; use a shorter window (--window, --min-periods)`;
    return {
      kind: "failure",
      errors: [{ code: "too-few-rows", message: text }],
      document: null,
      messages: [...warnings, { severity: "error", text }],
    };
  }
  const { low, high, riskFree } = sample;
  const extent = largestValues(low, high, riskFree);
  const outOfRange = magnitudeIssue(extent.low, extent.high);
  if (outOfRange !== null) {
    const errors = [{ code: outOfRange.code, message: `${loaded.source}: ${describeDiagnostic(outOfRange)}` }];
    const document = failureOutput({ tool, source: loaded.source, lowColumn: loaded.pair.low, highColumn: loaded.pair.high, errors });
    return {
      kind: "failure",
      errors,
      document,
      messages: [...warnings, ...errors.map((e) => ({ severity: "error" as const, text: e.message }))],
    };
  }
  const { table } = loaded;
  const meta: RollMeta = {
    tool,
    input: describeInput(loaded, options),
    spec,
    weight: options.weight,
    // Made only when a report asks (the CSV writes stamps from their keys).
    get dates() {
      return table.dates;
    },
    ...(table.stamps === undefined ? {} : { stamps: table.stamps }),
    inputWarnings,
  };
  const excess = options.uncertainty ? excessReturns({ ...sample, weight: options.weight }) : null;
  // The return-implied point of a window follows Fieller's condition at the report's confidence.
  const criticalValue = fiellerCriticalValue(options.confidence);
  const windows = () => iterateRollSolve(low, high, riskFree, options.weight, spec, criticalValue);
  // Only a window with a set has an interval for a point of it.
  const uncertaintyAt = (w: WindowSolution): WindowUncertainty | null =>
    excess === null || w.bounds === null
      ? null
      : windowUncertainty(excess.low, excess.high, w.start, w.end, w.summary, { confidence: options.confidence, longRun: options.longRun });
  return {
    kind: "windows",
    meta,
    messages: warnings,
    windows,
    columns: () => rollSolveColumns(low, high, riskFree, options.weight, spec, criticalValue),
    columnBlocks: (blockSize) => rollSolveColumnBlocks(low, high, riskFree, options.weight, spec, blockSize, criticalValue),
    uncertaintyAt,
    record: (window) => rollRecord(meta, window, uncertaintyAt(window)),
    *records() {
      for (const window of windows()) yield rollRecord(meta, window, uncertaintyAt(window));
    },
  };
}
