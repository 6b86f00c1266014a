/**
 * The checks of assessUncertainty's arguments (the library's entry point; the jobs pass options the
 * option table has checked by the same rules, core/parameters.ts): the sample's values finite and
 * aligned, at least `minimumForUncertainty` of them, returns within double precision's reach, and
 * each option within its rule.
 */

import { checkedSample, issues, parameterIssue } from "../arguments.js";
import { type LargestValues, magnitudeIssue } from "../cancellation.js";
import { diagnose, type Diagnostic } from "../diagnostics.js";
import { failure, type Result } from "../result.js";
import type { ReturnSample } from "../types.js";
import type { HacOptions } from "./options.js";

/** Standard errors need this many observations; with fewer, none are reported. */
export const minimumForUncertainty = 10;

interface CheckedOptions {
  readonly weight?: number;
  readonly confidence?: number;
  readonly hac?: HacOptions;
  readonly intervalSource?: string;
  readonly bootstrap?: { readonly replicates: number; readonly blockLength?: number | "auto"; readonly seed?: number };
  readonly bootstrapSummary?: unknown;
}

/** What is wrong with assessUncertainty's arguments: the empty list when nothing is. */
export function uncertaintyArgumentIssues(sample: ReturnSample, options: CheckedOptions): Diagnostic[] {
  const checked = checkedUncertaintyArguments(sample, options);
  return checked.ok ? [] : checked.issues;
}

/** uncertaintyArgumentIssues as a Result: the sample's largest values (checkedSample) when nothing is wrong. */
export function checkedUncertaintyArguments(sample: ReturnSample, options: CheckedOptions): Result<LargestValues, Diagnostic[]> {
  const checked = checkedSample(sample);
  const found = checked.ok ? [] : checked.issues;
  const { weight, confidence, hac, bootstrap } = options;
  found.push(
    ...issues(
      weight === undefined ? null : parameterIssue("weight", "weight", weight),
      confidence === undefined ? null : parameterIssue("confidence", "confidence", confidence),
      hac?.lags === undefined ? null : parameterIssue("hac.lags", "hacLags", hac.lags),
      bootstrap === undefined ? null : parameterIssue("bootstrap.replicates", "replicates", bootstrap.replicates),
      bootstrap?.blockLength === undefined || bootstrap.blockLength === "auto"
        ? null
        : parameterIssue("bootstrap.blockLength", "blockLength", bootstrap.blockLength),
      bootstrap?.seed === undefined ? null : parameterIssue("bootstrap.seed", "seed", bootstrap.seed),
    ),
  );
  if (hac?.lags !== undefined && hac.kernel !== undefined && hac.kernel !== "bartlett") {
    found.push(
      diagnose({
        code: "invalid-argument",
        argument: "hac.lags",
        value: String(hac.lags),
        expected: "given with the Bartlett kernel only",
      }),
    );
  }
  const replicates = bootstrap?.replicates ?? 0;
  if (options.intervalSource === "bootstrap" && options.bootstrapSummary === undefined && replicates < 2) {
    const expected = "given with bootstrap replicates (at least 2) or a bootstrap summary";
    found.push(diagnose({ code: "invalid-argument", argument: "intervalSource", value: '"bootstrap"', expected }));
  }
  if (!checked.ok || found.length > 0) return failure(found);
  const n = sample.low.length;
  if (n < minimumForUncertainty)
    return failure([diagnose({ code: "too-few-observations", observations: n, minimum: minimumForUncertainty })]);
  const outOfRange = magnitudeIssue(checked.value.low, checked.value.high);
  return outOfRange === null ? checked : failure([diagnose(outOfRange)]);
}
