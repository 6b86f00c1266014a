import { expect } from "vitest";

/** Relative closeness |a - e| <= rel * max(|e|, tiny) (+ abs). Every looser tolerance is justified where used. */
export function expectClose(actual: number | null | undefined, expected: number, tolerance: { rel?: number; abs?: number } = {}): void {
  const rel = tolerance.rel ?? 1e-12;
  const abs = tolerance.abs ?? 0;
  expect(actual, "value is missing").not.toBeNull();
  expect(actual, "value is missing").not.toBeUndefined();
  const a = actual as number;
  const bound = rel * Math.abs(expected) + abs;
  if (!(Math.abs(a - expected) <= bound)) {
    expect.fail(`expected ${a} to be within ${bound} of ${expected} (rel ${rel}, abs ${abs}); difference ${a - expected}`);
  }
}

/** Log relative error: the number of agreeing significant digits, capped at 15 (NIST StRD convention). */
export function logRelativeError(actual: number, certified: number): number {
  if (actual === certified) return 15;
  const lre = certified === 0 ? -Math.log10(Math.abs(actual)) : -Math.log10(Math.abs(actual - certified) / Math.abs(certified));
  return Math.min(15, lre);
}
