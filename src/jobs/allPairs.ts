/**
 * `--all-pairs A,B,C`: every unordered pair of the named columns once (no column with itself), and,
 * once a pair is read, its books ordered so that the one with the lower CAPM beta is `low`.
 */
import { solve } from "../core/solve.js";
import type { ReturnSample } from "../core/types.js";
import type { ColumnPair as Pair } from "../options/index.js";

/** Every unordered pair of `columns` in the order named (A:B, A:C, B:C), repeats of a name ignored. */
export function allPairsOf(columns: readonly string[]): Pair[] {
  const names = [...new Set(columns)];
  return names.flatMap((low, i) => names.slice(i + 1).map((high) => ({ low, high })));
}

/**
 * True when the pair read as named should be swapped: the "low" book's CAPM beta (on the market
 * w low + (1 - w) high of the order as named) is above the high book's. A pair whose CAPM fit fails
 * (a constant series) keeps its order: solving it reports why.
 */
export function lowerBetaSecond(sample: ReturnSample & { riskFree: number | Float64Array }, weight: number): boolean {
  const solved = solve(sample, { weight, steps: 2 });
  return solved.ok && solved.value.capm.low.beta > solved.value.capm.high.beta;
}
