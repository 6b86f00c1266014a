/**
 * The solve job: file names and one options object in, one record per (file, pair) out: a report with
 * its JSON document (what `solve --format json` prints), or a failure with its errors. Each (file,
 * pair) is read on its own rows (a missing value in one pair's columns drops no row of another), or,
 * with `low` and `high` written PATH:COLUMN and no files, the two books come from their own files
 * joined on date. A pair that fails does not stop the others.
 */
import { failure, type Result, success } from "../core/result.js";
import { SharpeMemo } from "../core/inference/sharpeMemo.js";
import { solveKeepingMoments } from "../core/solve.js";
import { inputWarningDiagnostic } from "../input/index.js";
import { type CommandOptions, type CommandOptionsInput, flagOf, type OptionIssue, parseOptions } from "../options/index.js";
import { assertJsonSafe, toSolveOutput } from "../report/json.js";
import { failureOutput, type SolveRecord } from "../report/records.js";
import type { SolveReport } from "../report/types.js";
import type { SolveFailureJson, SolveOutputJson } from "../schema/solveOutput.js";
import type { JobContext } from "./context.js";
import { describeInput, loadPairs, type PairLoad, readErrorMessages, readingMessages, runShape, sampleOf } from "./pairTables.js";
import { pairsFrom } from "./pairs.js";
import { tool } from "./tool.js";
import { expectSeries, withScratchAsync } from "../core/numerics/scratch.js";
import { pricingFor } from "./pricingStep.js";
import { uncertaintyFor } from "./uncertaintyStep.js";
import { modelColumns, modelsFor, modelWarnings } from "./modelsStep.js";

/** A message for a person: what a report also carries as a diagnostic, or why a pair failed. */
export interface JobMessage {
  readonly severity: "warning" | "error";
  readonly text: string;
  /** A warning or error from reading a file: the same for every pair read from it (the CLI shows it once). */
  readonly reading?: true;
}

/** How one (file, pair) went: ok (a set was found), rejected (read, but no set fits), failed (not solved). */
export type PairStatus = "ok" | "rejected" | "failed";

export interface SolvedPair {
  readonly record: SolveRecord;
  /** The JSON document of the record: a solve document, or a failure record (one `--format jsonl` line). */
  readonly document: SolveOutputJson | SolveFailureJson;
  readonly status: PairStatus;
  readonly messages: readonly JobMessage[];
}

export interface SolveJobResult {
  /** The options as validated, with every default filled in. */
  readonly options: CommandOptions<"solve">;
  readonly pairs: readonly SolvedPair[];
  /** More than one (file, pair) was asked for: outputs are lists of records. */
  readonly several: boolean;
}

/** Validates `input` (filling in defaults) and the rules that depend on how many files and pairs there are. */
export function solveOptions(files: readonly string[], input: CommandOptionsInput<"solve">): Result<SolveJobPlan, OptionIssue> {
  const parsed = parseOptions("solve", input);
  if (!parsed.ok) return parsed;
  const options = parsed.value;
  const { several } = runShape(files, options);
  if (several && (options.chart !== undefined || options.report !== undefined)) {
    const option = options.chart === undefined ? "report" : "chart";
    const value = options.chart ?? options.report ?? "";
    return failure({ code: "options-conflict", option, value, message: "draws one file and one pair; run it per pair" });
  }
  if (several && options.format === "json") {
    return failure({
      code: "options-conflict",
      option: "format",
      value: "json",
      message: "several files or pairs need --format jsonl (one record per line), csv or text",
    });
  }
  return success({ options, several });
}

export interface SolveJobPlan {
  readonly options: CommandOptions<"solve">;
  readonly several: boolean;
}

/**
 * Solves every (file, pair) of `files` ("-" or none: standard input, as `context.read` provides it)
 * with `options` (a library call may leave out anything with a default).
 */
export async function solveJob(
  files: readonly string[],
  input: CommandOptionsInput<"solve">,
  context: JobContext,
): Promise<Result<SolveJobResult, OptionIssue>> {
  const plan = solveOptions(files, input);
  return plan.ok ? success(await solvePlanned(files, plan.value, context)) : plan;
}

/** `solveJob` with options already validated by `solveOptions`. */
export async function solvePlanned(files: readonly string[], plan: SolveJobPlan, context: JobContext): Promise<SolveJobResult> {
  const { options, several } = plan;
  const pairs: SolvedPair[] = [];
  // One scratch pool for every pair: pairs of one file have the same rows and reuse the same series.
  // One memo of the books' Sharpe ratios: pairs of one file share books (the same column arrays).
  const sharpeMemo = new SharpeMemo();
  await withScratchAsync(async () => {
    for await (const load of loadPairs(files, pairsFrom(options), options, context.read, modelColumns(options)))
      pairs.push(await solveLoaded(load, options, context, sharpeMemo));
  });
  return { options, pairs, several };
}

async function solveLoaded(
  load: PairLoad,
  options: CommandOptions<"solve">,
  context: JobContext,
  sharpeMemo: SharpeMemo,
): Promise<SolvedPair> {
  if (!load.ok) return failed(load.source, load.pair, load.errors, readErrorMessages(load.errors));
  const loaded = load.value;
  const { source, pair } = loaded;
  const sample = sampleOf(loaded);
  // The uncertainty's and the pricing section's long series, asked for now: their memory is readied
  // while the solve runs.
  if (options.uncertainty) expectSeries(sample.low.length);
  const solved = solveKeepingMoments(sample, { weight: options.weight, steps: options.steps, confidence: options.confidence });
  if (!solved.ok) {
    return failed(
      source,
      pair,
      solved.issues.map((d) => ({ code: d.code, message: `${source}: ${d.message}` })),
    );
  }
  const { solution: found, moments } = solved.value;
  const beyond = options.uncertainty ? beyondSample(options, sample.low.length) : null;
  if (beyond !== null) return failed(source, pair, [{ code: "option-beyond-sample", message: `${source}: ${beyond}` }]);
  const assessed = await uncertaintyFor(sample, found, options, context, moments, sharpeMemo);
  const input = describeInput(loaded, options);
  // The pricing section, and the return-implied landmark and its diagnostics as the test decides them.
  const priced = pricingFor(sample, found, assessed.uncertainty, options, {
    periodsPerYear: input.frequency?.periodsPerYear ?? null,
    excessReturns: input.riskFree.kind !== "none",
    solved: moments,
  });
  const solution =
    assessed.note === null ? priced.solution : { ...priced.solution, diagnostics: [...priced.solution.diagnostics, assessed.note] };
  const models = modelsFor(loaded, sample, solution, assessed.uncertainty, options);
  const inputWarnings = loaded.table.warnings.map(inputWarningDiagnostic);
  const report: SolveReport = {
    tool,
    input,
    solution,
    uncertainty: assessed.uncertainty,
    pricing: priced.pricing,
    ...models,
    inputWarnings,
  };
  const messages: JobMessage[] = [
    ...readingMessages(inputWarnings),
    ...[...solution.diagnostics, ...modelWarnings(models)]
      .filter((d) => d.severity !== "info")
      .map((d) => ({ severity: d.severity === "error" ? ("error" as const) : ("warning" as const), text: `${source}: ${d.message}` })),
  ];
  const record: SolveRecord = { kind: "report", report };
  const document = toSolveOutput(report);
  assertJsonSafe(document); // as the CLI's renderers check: a NaN here is a bug, never a quiet null
  return { record, document, status: found.bounds === null ? "rejected" : "ok", messages };
}

function failed(
  source: string,
  pair: { low: string; high: string },
  errors: readonly { code: string; message: string }[],
  messages: readonly JobMessage[] = errors.map((e) => ({ severity: "error", text: e.message })),
): SolvedPair {
  const failure = { tool, source, lowColumn: pair.low, highColumn: pair.high, errors };
  return {
    record: { kind: "failure", failure },
    document: failureOutput(failure),
    status: "failed",
    messages,
  };
}

/**
 * Why a fixed HAC lag truncation or bootstrap block length cannot be used on a sample of n rows, or
 * null. From n on, a Bartlett kernel's bandwidth passes the sample (b = (lags + 1)/n > 1, beyond even
 * fixed-b theory: docs/methods.md) and its weights tend to 1, where the long-run variance of OLS
 * residuals is 0; a mean block of n rows or more draws rotations of the sample itself, whose
 * statistics barely vary. Either would give intervals of almost no width, and verdicts drawn from them.
 */
function beyondSample(options: CommandOptions<"solve">, n: number): string | null {
  if (options.hacLags !== undefined && options.hacLags >= n)
    return `${flagOf("hacLags")} ${options.hacLags} is not below the sample's ${n} rows: give at most ${n - 1}, or leave it out for the automatic rule`;
  const block = options.blockLength;
  if (options.bootstrap > 0 && block !== "auto" && block >= n)
    return `${flagOf("blockLength")} ${block} is not below the sample's ${n} rows: give a shorter mean block, or auto`;
  return null;
}
