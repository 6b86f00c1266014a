/**
 * The kinds of option value: how a flag's text becomes a value, the zod schema of the same value in a
 * config file or a library call, and the one sentence that says what a valid value is. A kind checks
 * a rule once (src/core/parameters.ts or the input layer's rules), so `--weight 1.3`, `"weight": 1.3`
 * in a config file and `{ weight: 1.3 }` in a library call are refused in the same words.
 */
import * as z from "zod/mini";
import { type NumberRange, numberRule, type Rule, refusal } from "../core/parameters.js";
import { parseDecimal } from "../input/index.js";

/** A kind of value: `parse` reads a flag's text (undefined: not valid); `schema` checks a JSON value. */
export interface Kind<T> {
  /** What a valid value is, e.g. "a number strictly between 0 and 1": every refusal says "must be <expected>". */
  readonly expected: string;
  parse(text: string, previous: T | undefined): T | undefined;
  schema(): z.ZodMiniType<T>;
  /** How the value is shown as a default in help and in the README. */
  show(value: T): string;
  /** The refusal of a flag's text, when the kind can say why this value in particular is refused. */
  refuse?(text: string): string;
}

/** The sentence of a refusal: "must be <expected>". */
export const mustBe = (kind: { readonly expected: string }): string => `must be ${kind.expected}`;

/** The refusal of a flag's text by `kind`: its particular reason when it has one. */
export const refusalOf = <T>(kind: Kind<T>, text: string): string => kind.refuse?.(text) ?? mustBe(kind);

/** A zod check of `rule`, refusing in the rule's words (with the value's particular reason, if any). */
const refine = <T>(rule: Rule<T>) => z.refine<T>(rule.accept, { error: (issue) => refusal(rule, issue.input as T) });

/** A finite number following `rule` (from src/core/parameters.ts), or within `range`. */
export function numberKind(rule: Rule<number> | NumberRange = {}): Kind<number> {
  const checked = "accept" in rule ? rule : numberRule(rule);
  const error = `must be ${checked.expected}`;
  return {
    expected: checked.expected,
    parse: (text) => {
      const x = parseDecimal(text);
      return x !== null && checked.accept(x) ? x : undefined;
    },
    schema: () => z.number({ error }).check(refine(checked)),
    show: String,
  };
}

/** A text of at least one character. */
export function textKind(expected = "a non-empty text"): Kind<string> {
  const error = `must be ${expected}`;
  return {
    expected,
    parse: (text) => (text.length > 0 ? text : undefined),
    schema: () => z.string({ error }).check(z.minLength(1, { error })),
    show: (value) => value,
  };
}

/** A text following `rule` (e.g. a delimiter, a date layout). */
export function ruledTextKind(rule: Rule<string>): Kind<string> {
  const error = `must be ${rule.expected}`;
  return {
    expected: rule.expected,
    parse: (text) => (rule.accept(text) ? text : undefined),
    schema: () => z.string({ error }).check(refine(rule)),
    show: (value) => value,
    refuse: (text) => refusal(rule, text),
  };
}

/** One of `choices`. */
export function choiceKind<const C extends readonly [string, ...string[]]>(choices: C): Kind<C[number]> & { readonly choices: C } {
  const expected = `one of ${choices.join(", ")}`;
  const error = `must be ${expected}`;
  return {
    expected,
    choices,
    parse: (text) => (choices.includes(text) ? (text as C[number]) : undefined),
    schema: () => z.enum(choices as unknown as readonly [C[number], ...C[number][]], { error }) as unknown as z.ZodMiniType<C[number]>,
    show: (value) => value,
  };
}

/** A switch: a flag without a value, or true/false in a file. */
export function switchKind(): Kind<boolean> {
  return {
    expected: "true or false",
    parse: () => true,
    schema: () => z.boolean({ error: "must be true or false" }),
    show: (value) => (value ? "on" : "off"),
  };
}

/** Comma-separated non-empty names on the command line; an array of them in a file. */
export function nameListKind(count?: number): Kind<readonly string[]> {
  const expected = count === undefined ? "comma-separated non-empty names" : `${count} comma-separated non-empty names`;
  const error = `must be ${expected}`;
  const accept = (names: readonly string[]): boolean =>
    names.every((s) => s.trim() !== "") && (count === undefined || names.length === count);
  return {
    expected,
    parse: (text) => {
      const names = text.split(",").map((s) => s.trim());
      return accept(names) ? names : undefined;
    },
    schema: () => {
      const list = z.array(z.string({ error }), { error }).check(z.refine(accept, { error }));
      return z.pipe(
        list,
        z.transform((names: string[]) => names.map((s) => s.trim())),
      ) as unknown as z.ZodMiniType<readonly string[]>;
    },
    show: (value) => value.join(","),
  };
}

/** A pair of columns: "LOW:HIGH" (split at the first colon), repeatable; in a file also {"low", "high"}. */
export interface ColumnPair {
  readonly low: string;
  readonly high: string;
}

export function pairListKind(): Kind<ColumnPair[]> {
  const expected = "LOW:HIGH, two column names separated by a colon";
  const error = `must be ${expected}`;
  const split = (text: string): ColumnPair | undefined => {
    const at = text.indexOf(":");
    const low = text.slice(0, at).trim();
    const high = text.slice(at + 1).trim();
    return at < 0 || low === "" || high === "" ? undefined : { low, high };
  };
  return {
    expected,
    parse: (text, previous) => {
      const pair = split(text);
      return pair === undefined ? undefined : [...(previous ?? []), pair];
    },
    schema: () => {
      const asText = z.pipe(
        z.string({ error }),
        z.transform((text: string, context) => {
          const pair = split(text);
          if (pair === undefined) context.issues.push({ code: "custom", input: text, message: error });
          return pair ?? { low: "", high: "" };
        }),
      );
      const entry = z.union([asText, z.strictObject({ low: textKind().schema(), high: textKind().schema() })], { error });
      return z.array(entry, { error }) as unknown as z.ZodMiniType<ColumnPair[]>;
    },
    show: (value) => value.map((p) => `${p.low}:${p.high}`).join(" "),
  };
}

/** A column name or a number (the risk-free rate): text on the command line, a string or a number in a file. */
export function columnOrNumberKind(): Kind<string> {
  const expected = "a column name or a number";
  const error = `must be ${expected}`;
  return {
    expected,
    parse: (text) => (text.trim() === "" ? undefined : text),
    schema: () =>
      z.pipe(
        z.union([z.string({ error }).check(z.minLength(1, { error })), z.number({ error }).check(refine(numberRule()))], { error }),
        z.transform((value: string | number) => String(value)),
      ) as unknown as z.ZodMiniType<string>,
    show: (value) => value,
  };
}

/** One number following `rule`, or several separated by commas; in a file a number or an array of them. */
export function numberListKind(rule: Rule<number>): Kind<readonly number[]> {
  const expected = `${rule.expected}, or several such numbers separated by commas`;
  const error = `must be ${expected}`;
  const number = () => z.number({ error }).check(z.refine(rule.accept, { error }));
  return {
    expected,
    parse: (text) => {
      const values = text.split(",").map((part) => parseDecimal(part.trim()));
      return values.every((x): x is number => x !== null && rule.accept(x)) ? values : undefined;
    },
    schema: () =>
      z.pipe(
        z.union([number(), z.array(number(), { error }).check(z.minLength(1, { error }))], { error }),
        z.transform((value: number | number[]) => (typeof value === "number" ? [value] : value)),
      ) as unknown as z.ZodMiniType<readonly number[]>,
    show: (value) => value.join(","),
  };
}

/** "auto" or a number following `rule`. */
export function autoOrNumberKind(rule: Rule<number>): Kind<number | "auto"> {
  const expected = `"auto" or ${rule.expected}`;
  const error = `must be ${expected}`;
  return {
    expected,
    parse: (text) => {
      if (text === "auto") return "auto";
      const x = parseDecimal(text);
      return x !== null && rule.accept(x) ? x : undefined;
    },
    // A number outside the rule is refused in the kind's words (with "auto"), as the flag is.
    schema: () =>
      z.union([z.literal("auto"), z.number({ error }).check(z.refine(rule.accept, { error }))], { error }) as z.ZodMiniType<
        number | "auto"
      >,
    show: String,
  };
}

/** A calendar date YYYY-MM-DD that exists. */
export function isoDateKind(): Kind<string> {
  const expected = "a date YYYY-MM-DD";
  const accept = (text: string): boolean => {
    const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
    if (match === null) return false;
    const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])];
    const date = new Date(Date.UTC(year, month - 1, day));
    return date.getUTCFullYear() === year && date.getUTCMonth() === month - 1 && date.getUTCDate() === day;
  };
  return ruledTextKind({ accept, expected });
}

/** GARCH(1,1) coefficients "alpha,beta" (a stationary process: both >= 0, alpha + beta < 1). */
export interface GarchCoefficients {
  readonly alpha: number;
  readonly beta: number;
}

export function garchKind(): Kind<GarchCoefficients> {
  const expected = "two numbers alpha,beta >= 0 with alpha + beta < 1";
  const error = `must be ${expected}`;
  const accept = ({ alpha, beta }: GarchCoefficients): boolean =>
    Number.isFinite(alpha) && Number.isFinite(beta) && alpha >= 0 && beta >= 0 && alpha + beta < 1;
  return {
    expected,
    parse: (text) => {
      const parts = text.split(",").map((s) => parseDecimal(s.trim()));
      const [alpha, beta] = parts;
      if (parts.length !== 2 || alpha == null || beta == null) return undefined;
      return accept({ alpha, beta }) ? { alpha, beta } : undefined;
    },
    schema: () => z.strictObject({ alpha: z.number({ error }), beta: z.number({ error }) }, { error }).check(z.refine(accept, { error })),
    show: (value) => `${value.alpha},${value.beta}`,
  };
}
