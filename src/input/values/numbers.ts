/**
 * Strict number parsing for return files. Only plain decimal notation is a number:
 * optional sign, digits, optional fraction, optional exponent, optional surrounding spaces or tabs.
 */

const DECIMAL = /^[ \t]*[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?[ \t]*$/;

/**
 * Parse one field as a decimal number. Returns null for anything else: "", "1.2abc", "0x10",
 * "Infinity", "1,5", "--1", "1e999" (not finite). The value is what `Number` gives for the
 * accepted text, so it is the correctly rounded double.
 */
export function parseDecimal(text: string): number | null {
  if (!DECIMAL.test(text)) return null;
  const value = Number(text);
  return Number.isFinite(value) ? value : null;
}

const MISSING_TOKENS = new Set(["", "na", "nan", "null", "n/a"]);

/** True for the built-in missing-value spellings: empty, NA, NaN, null, N/A (any case, spaces ignored). */
export function isMissingToken(text: string): boolean {
  return MISSING_TOKENS.has(text.trim().toLowerCase());
}

/**
 * User-declared sentinels for missing values. A sentinel that is a number (e.g. "-99.99") matches
 * every field with that numeric value ("-99.990" too); any other sentinel matches the field text
 * case-insensitively after trimming.
 */
export interface Sentinels {
  readonly numbers: ReadonlySet<number>;
  readonly texts: ReadonlySet<string>;
}

/** Split declared sentinel strings into numeric and textual ones (see `Sentinels`). */
export function compileSentinels(values: readonly string[]): Sentinels {
  const numbers = new Set<number>();
  const texts = new Set<string>();
  for (const value of values) {
    const n = parseDecimal(value);
    if (n === null) texts.add(value.trim().toLowerCase());
    else numbers.add(n);
  }
  return { numbers, texts };
}
