/** Small helpers shared by the test/core suites (not a test file itself). */

import { expect } from "vitest";
import type { Diagnostic } from "../../src/core/diagnostics.js";
import { implied, type ImpliedSolution } from "../../src/core/forward/implied.js";
import type { Structure } from "../../src/core/forward/populationMoments.js";
import type { Result } from "../../src/core/result.js";
import { solve } from "../../src/core/solve.js";
import type { Candidate, IdentifiedBounds, Landmarks, ReturnSample, Solution, SolveOptions } from "../../src/core/types.js";

/** The value of a library call that must succeed; fails the test with its diagnostics otherwise. */
export function ok<T>(result: Result<T, readonly Diagnostic[]>): T {
  if (!result.ok) expect.fail(`failed: ${result.issues.map((d) => d.message).join("; ")}`);
  return result.value;
}

/** Runs implied and fails the test, listing the diagnostics, unless it succeeded. */
export function impliedOk(structure: Structure, steps: number): ImpliedSolution {
  const result = implied(structure, steps);
  if (!result.ok) expect.fail(`implied failed: ${result.issues.map((d) => d.message).join("; ")}`);
  return result.value;
}

/** Runs solve and fails the test, listing the diagnostics, unless it succeeded. */
export function solveOk(sample: ReturnSample, options?: SolveOptions): Solution {
  const result = solve(sample, options);
  if (!result.ok) expect.fail(`solve failed: ${result.issues.map((d) => d.code).join(", ")}`);
  return result.value;
}

/** solveOk, and the identified set must exist (positive covariance). */
export function solveWithSet(
  sample: ReturnSample,
  options?: SolveOptions,
): Solution & { readonly bounds: IdentifiedBounds; readonly landmarks: Landmarks } {
  const solution = solveOk(sample, options);
  expect(solution.bounds, "bounds").not.toBeNull();
  expect(solution.landmarks, "landmarks").not.toBeNull();
  return solution as Solution & { readonly bounds: IdentifiedBounds; readonly landmarks: Landmarks };
}

export function nonNull<T>(value: T | null | undefined, what: string): T {
  expect(value, what).not.toBeNull();
  expect(value, what).not.toBeUndefined();
  return value as T;
}

export function codes(diagnostics: readonly Diagnostic[]): string[] {
  return diagnostics.map((d) => d.code);
}

export function gridAt(grid: readonly Candidate[], index: number): Candidate {
  return nonNull(grid[index], `grid[${index}]`);
}
