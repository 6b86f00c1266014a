/**
 * Which (low, high) column pairs a run solves: `--low/--high`, repeatable `--pair low:high`, and every
 * combination of `--lows a,b --highs x,y`, in that order, without repeats.
 */
import { InvalidArgumentError } from "commander";

export interface Pair {
  readonly low: string;
  readonly high: string;
}

/** Commander collector for a repeatable `--pair LOW:HIGH` (split at the first colon). */
export function collectPair(value: string, previous: Pair[] = []): Pair[] {
  const at = value.indexOf(":");
  const low = value.slice(0, at).trim();
  const high = value.slice(at + 1).trim();
  if (at < 0 || low === "" || high === "") throw new InvalidArgumentError("must be LOW:HIGH, two column names separated by a colon");
  return [...previous, { low, high }];
}

/** Comma-separated column names. */
export function columnList(value: string): string[] {
  const names = value.split(",").map((s) => s.trim());
  if (names.some((s) => s === "")) throw new InvalidArgumentError("must be comma-separated non-empty column names");
  return names;
}

export function pairsFrom(options: {
  readonly low?: string | undefined;
  readonly high?: string | undefined;
  readonly pair?: readonly Pair[] | undefined;
  readonly lows?: readonly string[] | undefined;
  readonly highs?: readonly string[] | undefined;
}): Pair[] {
  const pairs: Pair[] = [];
  const add = (pair: Pair): void => {
    if (!pairs.some((p) => p.low === pair.low && p.high === pair.high)) pairs.push(pair);
  };
  if (options.low !== undefined && options.high !== undefined) add({ low: options.low, high: options.high });
  for (const pair of options.pair ?? []) add(pair);
  for (const low of options.lows ?? []) for (const high of options.highs ?? []) add({ low, high });
  return pairs;
}
