/** The uncertainty step of `solve`: HAC, delta method, intervals, and the bootstrap when asked for. */
import { diagnose, type Diagnostic } from "../core/diagnostics.js";
import type { BootstrapSummary } from "../core/inference/bootstrap/summary.js";
import type { HacOptions } from "../core/inference/options.js";
import { assessUncertainty, type UncertaintySample } from "../core/inference/uncertainty.js";
import type { Uncertainty } from "../core/inference/uncertaintyTypes.js";
import type { Solution } from "../core/types.js";
import { runBootstrap } from "./runtime/bootstrapThreads.js";
import type { CliIo } from "./runtime/io.js";
import { minimumForUncertainty, type SolveCliOptions } from "./options.js";
import { createProgress } from "./runtime/progress.js";

/** Standard errors and intervals as the options ask, or null with the reason as a diagnostic. */
export async function uncertaintyFor(
  sample: UncertaintySample,
  solution: Solution,
  options: SolveCliOptions,
  io: CliIo,
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
    const progress = createProgress(io, "bootstrap", options.bootstrap);
    bootstrapSummary = await runBootstrap(
      { ...sample, weight: options.weight },
      {
        replicates: options.bootstrap,
        blockLength: options.blockLength,
        seed: options.seed,
        confidence: options.confidence,
        threads: options.threads,
      },
      (done) => progress.update(done),
    );
    progress.finish();
  }
  const uncertainty = assessUncertainty(sample, {
    weight: options.weight,
    confidence: options.confidence,
    longRun: options.longRun,
    hac: hacOptions(options),
    interval: options.interval,
    intervalSource: options.intervalSource,
    ...(bootstrapSummary === undefined ? {} : { bootstrapSummary }),
  });
  return { uncertainty, note: null };
}

export function hacOptions(
  options: Pick<SolveCliOptions, "hacKernel" | "hacBandwidth" | "hacPrewhite" | "hacAdjust" | "hacLags">,
): HacOptions {
  return {
    kernel: options.hacKernel,
    bandwidth: options.hacBandwidth,
    prewhite: options.hacPrewhite,
    adjust: options.hacAdjust,
    ...(options.hacLags === undefined ? {} : { lags: options.hacLags }),
  };
}
