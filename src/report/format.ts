/**
 * Number formatting for the text report: a fixed number of significant digits, switching to
 * scientific notation for very small or very large magnitudes (variances of daily returns such as
 * 1.234e-5). Values are decimal; nothing is ever scaled to percent.
 */

/** Significant digits for single values (bounds, moments). */
export const defaultDigits = 5;
/** Significant digits in the wide tables (landmarks, candidate grid), so lines stay under 100 columns. */
export const tableDigits = 4;
/** Significant digits for test statistics and p-values. */
export const statisticDigits = 3;

/** Shown where the core reports null (a quantity that is not defined for this sample). */
export const notAvailable = "n/a";

/**
 * Formats a number with `digits` significant digits: fixed notation for magnitudes in [1e-3, 10^digits),
 * scientific below and above (`1.234e-5`), "0" for zero (either sign), `n/a` for null.
 */
export function formatNumber(x: number | null, digits: number = defaultDigits): string {
  if (x === null) return notAvailable;
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return "0";
  const magnitude = Math.abs(x);
  if (magnitude < 1e-3 || magnitude >= 10 ** digits) return x.toExponential(digits - 1);
  const fixed = x.toPrecision(digits);
  // toPrecision itself switches to exponential when rounding reaches 10^digits (e.g. 99999.7 at 5).
  return fixed.includes("e") ? x.toExponential(digits - 1) : fixed;
}

/** Formats a count or other integer exactly. */
export function formatCount(n: number): string {
  return String(n);
}
