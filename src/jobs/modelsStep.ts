/**
 * The extensions of a solve (docs/methods.md §2, §3): the model with an independent index when
 * `index` names a column, and the identified set under each assumed noise correlation.
 */
import type { Uncertainty } from "../core/inference/uncertaintyTypes.js";
import { correlatedNoiseSet } from "../core/models/correlatedNoise.js";
import { solveIndex } from "../core/models/indexSolve.js";
import type { ReturnSample, Solution } from "../core/types.js";
import type { CommandOptions } from "../options/index.js";
import type { IndexReport, SensitivityReport } from "../report/types.js";
import type { PairTable } from "./pairTables.js";
import { hacOptions } from "./uncertaintyStep.js";
import { factorColumns, factorModelFor } from "./factorStep.js";
import type { FactorModel } from "../core/models/factorModel.js";

/** The columns the extensions read besides the books'. */
export const modelColumns = (options: Pick<CommandOptions<"solve">, "index" | "portfolios" | "marketWeights">): string[] => [
  ...(options.index === undefined ? [] : [options.index]),
  ...factorColumns(options),
];

export interface ModelResults {
  readonly index: IndexReport | null;
  readonly sensitivity: SensitivityReport | null;
  readonly factorModel: FactorModel | null;
}

export function modelsFor(
  loaded: PairTable,
  sample: ReturnSample & { riskFree: number | Float64Array },
  solution: Solution,
  uncertainty: Uncertainty | null,
  options: CommandOptions<"solve">,
): ModelResults {
  const column = options.index;
  const series = column === undefined ? undefined : loaded.extras.get(column);
  const bootstrap = uncertainty?.bootstrap ?? null;
  const index =
    column === undefined || series === undefined
      ? null
      : {
          column,
          ...solveIndex(
            { ...sample, index: series },
            {
              weight: solution.weight,
              uncertainty: uncertainty === null ? null : { longRun: options.longRun, hac: hacOptions(options) },
              // The bootstrap's own resamples (its block length and seed), replicate by replicate.
              bootstrap:
                bootstrap === null ? null : { replicates: bootstrap.replicates, blockLength: bootstrap.blockLength, seed: bootstrap.seed },
              lowBetaBounds: solution.bounds?.lowBeta ?? null,
            },
          ),
        };
  const m = solution.moments;
  const moments = { weight: solution.weight, lowVariance: m.low.variance, highVariance: m.high.variance, covariance: m.covariance.lowHigh };
  const sensitivity = options.noiseCorrelation?.map((rho) => correlatedNoiseSet(moments, rho, solution.bounds)) ?? null;
  return { index, sensitivity, factorModel: factorModelFor(loaded, sample.riskFree, options) };
}

/** The warnings of the extensions, for the job's messages. */
export function modelWarnings(results: ModelResults) {
  return [
    ...(results.index?.diagnostics ?? []),
    ...(results.sensitivity ?? []).flatMap((entry) => entry.diagnostics),
    ...(results.factorModel?.diagnostics ?? []),
  ].filter((d) => d.severity !== "info");
}
