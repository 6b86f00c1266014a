/**
 * The one-factor model on k portfolios (docs/methods.md §31) when `portfolios` names columns: their
 * excess returns (the pair's risk-free return subtracted) on the pair's rows, market weights as given
 * or equal.
 */
import { type FactorModel, factorModelFromCovariance, sampleCovariance } from "../core/models/factorModel.js";
import type { CommandOptions } from "../options/index.js";
import type { PairTable } from "./pairTables.js";

type FactorOptions = Pick<CommandOptions<"solve">, "portfolios" | "marketWeights">;

/** The columns the factor model reads besides the books'. */
export const factorColumns = (options: FactorOptions): string[] => [...(options.portfolios ?? [])];

export function factorModelFor(loaded: PairTable, riskFree: number | Float64Array, options: FactorOptions): FactorModel | null {
  const names = options.portfolios;
  if (names === undefined) return null;
  const columns = names.map((name) => loaded.extras.get(name)!);
  const weights = options.marketWeights ?? names.map(() => 1);
  return factorModelFromCovariance(names, weights, sampleCovariance(columns, riskFree), columns[0]?.length ?? 0);
}
