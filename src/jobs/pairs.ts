/**
 * Which (low, high) column pairs a run solves: `low/high`, every `pair`, and every combination of
 * `lows` x `highs`, and every unordered pair of `allPairs` (src/jobs/allPairs.ts), in that order,
 * without repeats.
 */
import type { ColumnPair } from "../options/index.js";
import { allPairsOf } from "./allPairs.js";

export type Pair = ColumnPair;

export function pairsFrom(options: {
  readonly low?: string | undefined;
  readonly high?: string | undefined;
  readonly pair?: readonly Pair[] | undefined;
  readonly lows?: readonly string[] | undefined;
  readonly highs?: readonly string[] | undefined;
  readonly allPairs?: readonly string[] | undefined;
}): Pair[] {
  const pairs: Pair[] = [];
  const add = (pair: Pair): void => {
    if (!pairs.some((p) => p.low === pair.low && p.high === pair.high)) pairs.push(pair);
  };
  if (options.low !== undefined && options.high !== undefined) add({ low: options.low, high: options.high });
  for (const pair of options.pair ?? []) add(pair);
  for (const low of options.lows ?? []) for (const high of options.highs ?? []) add({ low, high });
  for (const pair of allPairsOf(options.allPairs ?? [])) add(pair);
  return pairs;
}
