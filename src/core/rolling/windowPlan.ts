/**
 * Rolling and expanding windows: which windows a spec gives. The moments of every window are kept in
 * O(1) amortised work each (scan.ts), their CAPM fits and sets follow in closed form (windows.ts).
 * Pure: numbers in, values out.
 *
 * Conventions are solve's (solve.ts): excess returns r - rf formed row by row exactly as solve forms
 * them, market proxy M = w low + (1 - w) high, divisor n - 1. A window spec is either
 * - `{ kind: "window", size, step }`: rows [s, s + size - 1] for s = o, o + step, o + 2 step, ...
 *   while the window fits in the sample, or
 * - `{ kind: "expanding", minPeriods, step }`: rows [0, e] for e = o + minPeriods - 1, then every step.
 * The offset o aligns the windows (`align`, default "end"): with "end", o = (n - first) mod step, so the
 * newest window ends on the last row and the rows that do not fill a whole step are the oldest ones;
 * with "start", o = 0 (the first window starts at row 0 and trailing rows may go unreported).
 */

import { assertParameter } from "../parameters.js";

/** Which windows to compute. `step` is the distance between consecutive windows' ends (and starts). */
export type WindowSpec =
  | { readonly kind: "window"; readonly size: number; readonly step: number; readonly align?: WindowAlignment }
  | { readonly kind: "expanding"; readonly minPeriods: number; readonly step: number; readonly align?: WindowAlignment };

/** Where the windows are anchored: the newest ends on the last row ("end"), or the first starts on row 0. */
export type WindowAlignment = "end" | "start";
export const windowAlignments = ["end", "start"] as const satisfies readonly WindowAlignment[];

/** The rows skipped before the first window's start (rolling) or added to its end (expanding). */
export function windowOffset(length: number, spec: WindowSpec): number {
  const first = spec.kind === "window" ? spec.size : spec.minPeriods;
  if ((spec.align ?? "end") === "start" || length < first) return 0;
  return (length - first) % spec.step;
}

/** The number of windows `spec` gives on `length` rows (0 when the first window does not fit). */
export function windowCount(length: number, spec: WindowSpec): number {
  checkSpec(spec);
  const first = spec.kind === "window" ? spec.size : spec.minPeriods;
  return length < first ? 0 : Math.floor((length - first) / spec.step) + 1;
}

/** Throws a RangeError (a programming error) for a window smaller than the minimum or a step below 1. */
export function checkSpec(spec: WindowSpec): void {
  assertParameter("rolling", "windowLength", spec.kind === "window" ? spec.size : spec.minPeriods);
  assertParameter("rolling", "windowStep", spec.step);
}
