/** The uncertainty step of a solve: HAC, delta method, intervals, and the bootstrap when asked for. */
import { type Diagnostic, diagnose } from "../core/diagnostics.js";
import type { BootstrapSummary } from "../core/inference/bootstrap/summary.js";
import type { HacOptions } from "../core/inference/options.js";
import type { SharpeMemo } from "../core/inference/sharpeMemo.js";
import { assessUncertainty, minimumForUncertainty, type UncertaintySample } from "../core/inference/uncertainty.js";
import type { Uncertainty } from "../core/inference/uncertaintyTypes.js";
import type { SolvedMoments } from "../core/solve.js";
import type { Solution } from "../core/types.js";
import type { CommandOptions } from "../options/index.js";
import { runBootstrap } from "./bootstrapStep.js";
import type { JobContext } from "./context.js";

/** Bootstrap threads when none are asked for: the cores, at most 4 (more rarely pays for a worker's start-up). */
export const defaultThreads = (cores: number): number => Math.max(1, Math.min(4, cores));

/** Standard errors and intervals as the options ask, or null with the reason as a diagnostic. */
export async function uncertaintyFor(
  sample: UncertaintySample,
  solution: Solution,
  options: CommandOptions<"solve">,
  context: JobContext,
  solved?: SolvedMoments,
  sharpeMemo?: SharpeMemo,
): Promise<{ uncertainty: Uncertainty | null; note: Diagnostic | null }> {
  if (!options.uncertainty) return { uncertainty: null, note: null };
  if (solution.observations < minimumForUncertainty) {
    return {
      uncertainty: null,
      note: diagnose({ code: "uncertainty-unavailable", observations: solution.observations, minimum: minimumForUncertainty }),
    };
  }
  let bootstrapSummary: BootstrapSummary | undefined;
  if (options.bootstrap > 0) {
    const settings = {
      replicates: options.bootstrap,
      blockLength: options.blockLength,
      seed: options.seed,
      confidence: options.confidence,
      threads: options.threads ?? 1,
    };
    bootstrapSummary = await runBootstrap({ ...sample, weight: options.weight }, settings, context);
  }
  const assessed = assessUncertainty(sample, {
    weight: options.weight,
    confidence: options.confidence,
    longRun: options.longRun,
    hac: hacOptions(options),
    interval: options.interval,
    intervalSource: options.intervalSource,
    ...(bootstrapSummary === undefined ? {} : { bootstrapSummary }),
    ...(solved === undefined ? {} : { solved }),
    ...(sharpeMemo === undefined ? {} : { sharpeMemo }),
  });
  // The options passed the option table's rules and solve accepted the sample: a refusal is a bug.
  if (!assessed.ok) throw new Error(`uncertaintyFor: assessUncertainty refused a solved sample: ${assessed.issues[0]?.message}`);
  const uncertainty = assessed.value;
  // No set (the covariance not positive, or not determined by the data): no interval for a point of it.
  if (solution.bounds === null) return { uncertainty: { ...uncertainty, bounds: null, lowBeta: null, highBeta: null }, note: null };
  return { uncertainty, note: null };
}

export function hacOptions(
  options: Pick<CommandOptions<"solve">, "hacKernel" | "hacBandwidth" | "hacPrewhite" | "hacAdjust" | "hacLags">,
): HacOptions {
  return {
    kernel: options.hacKernel,
    bandwidth: options.hacBandwidth,
    prewhite: options.hacPrewhite,
    adjust: options.hacAdjust,
    ...(options.hacLags === undefined ? {} : { lags: options.hacLags }),
  };
}
