/**
 * The implied job: a structure (per period, decimal) in, what it implies out: population moments,
 * CAPM betas and alphas, the identified set a sample would show, with `solve`'s field names. Its
 * JSON document is what `implied --format json` prints.
 */
import { implied } from "../core/forward/implied.js";
import { type Result, success } from "../core/result.js";
import { type CommandOptions, type CommandOptionsInput, type OptionIssue, parseOptions } from "../options/index.js";
import { type ImpliedReport, impliedOutput } from "../report/impliedReport.js";
import { assertJsonSafe } from "../report/json.js";
import type { ImpliedOutputJson } from "../schema/impliedOutput.js";
import { tool } from "./tool.js";

export interface ImpliedJobResult {
  readonly options: CommandOptions<"implied">;
  readonly report: ImpliedReport;
  readonly document: ImpliedOutputJson;
  /** ok: the structure implies an identified set; rejected: it does not (a diagnostic says why). */
  readonly status: "ok" | "rejected";
}

export function impliedJob(input: CommandOptionsInput<"implied">): Result<ImpliedJobResult, OptionIssue> {
  const parsed = parseOptions("implied", input);
  if (!parsed.ok) return parsed;
  const options = parsed.value;
  const { lowBeta, factorVol, factorMean, lowNoiseVol, highNoiseVol, weight } = options;
  const computed = implied({ lowBeta, factorVol, factorMean, lowNoiseVol, highNoiseVol, weight }, options.steps);
  // The option table checks every rule implied checks: a refusal here is a bug, never a user's error.
  if (!computed.ok) throw new Error(`impliedJob: options passed validation but implied refused them: ${computed.issues[0]?.message}`);
  const solution = computed.value;
  const report: ImpliedReport = { tool, solution, riskFree: options.rf };
  const document = impliedOutput(report);
  assertJsonSafe(document); // as the CLI's renderer checks: a NaN here is a bug, never a quiet null
  return success({ options, report, document, status: solution.bounds === null ? "rejected" : "ok" });
}
