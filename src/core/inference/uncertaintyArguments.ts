/**
 * The checks of assessUncertainty's arguments (the library's entry point; the jobs pass options the
 * option table has checked by the same rules, core/parameters.ts): the sample's values finite and
 * aligned, at least `minimumForUncertainty` of them, returns within double precision's reach, and
 * each option within its rule.
 */

import { checkedSample, issues, parameterIssue } from "../arguments.js";
import { type LargestValues, largestValues, magnitudeIssue } from "../cancellation.js";
import { diagnose, type Diagnostic } from "../diagnostics.js";
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
  return checkedUncertaintyArguments(sample, options).issues;
}

/** uncertaintyArgumentIssues, and when there are none the sample's largest values (checkedSample). */
export function checkedUncertaintyArguments(
  sample: ReturnSample,
  options: CheckedOptions,
): { readonly issues: Diagnostic[]; readonly extent: LargestValues | null } {
  const checked = checkedSample(sample);
  const found = checked.issues;
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
  if (found.length > 0) return { issues: found, extent: null };
  const n = sample.low.length;
  if (n < minimumForUncertainty)
    return { issues: [diagnose({ code: "too-few-observations", observations: n, minimum: minimumForUncertainty })], extent: null };
  const extent = checked.extent ?? largestValues(sample.low, sample.high, sample.riskFree ?? 0);
  const outOfRange = magnitudeIssue(extent.low, extent.high);
  return outOfRange === null ? { issues: [], extent } : { issues: [diagnose(outOfRange)], extent: null };
}
