/**
 * The zod schema of each command's options, generated from the option table, and their TypeScript
 * types, inferred from the table. The rules across options (--low with --high, a window or
 * --expanding, ...) are here too, each with its message. Schemas are built on first use, for the
 * command that runs: building every command's up front costs start-up time on every run.
 */
import * as z from "zod/mini";
import { minimumObservations, refusal } from "../core/parameters.js";
import { failure, type Result, success } from "../core/result.js";
import { closestName, EXTREME_LIMIT, inputRules, parseDecimal } from "../input/index.js";
import type { Kind } from "./kinds.js";
import { type CommandName, commandNames, type OptionKey, type OptionSpec, type OptionTable, optionTable } from "./table.js";

type EntriesOf<C extends CommandName> = { [K in OptionKey]: C extends OptionTable[K]["commands"][number] ? K : never }[OptionKey];
type ValueOf<K extends OptionKey> = OptionTable[K]["kind"] extends Kind<infer T> ? T : never;
type NameOf<K extends OptionKey> = OptionTable[K] extends { flagOnly: true } ? never : OptionTable[K]["name"];
type Defaulted<K extends OptionKey> = OptionTable[K] extends { default: unknown } ? true : false;
type Required<K extends OptionKey> = OptionTable[K] extends { required: true } ? true : false;
type Simplify<T> = { [K in keyof T]: T[K] } & {};

/** The options of command `C` once validated: an option with a default is always there. */
export type CommandOptions<C extends CommandName> = Simplify<
  { [K in EntriesOf<C> as Defaulted<K> extends true ? NameOf<K> : Required<K> extends true ? NameOf<K> : never]: ValueOf<K> } & {
    [K in EntriesOf<C> as Defaulted<K> extends true ? never : Required<K> extends true ? never : NameOf<K>]?: ValueOf<K> | undefined;
  }
>;

/** The options of command `C` as a library call or a config file gives them: defaults may be left out. */
export type CommandOptionsInput<C extends CommandName> = Simplify<
  { [K in EntriesOf<C> as Required<K> extends true ? NameOf<K> : never]: ValueOf<K> } & {
    [K in EntriesOf<C> as Required<K> extends true ? never : NameOf<K>]?: ValueOf<K> | undefined;
  }
>;

/** The table's entries for `command`, in table order, without the flag-only ones when `flagsOnly` is false. */
export function entriesFor(command: CommandName, { withFlagOnly = false } = {}): readonly OptionSpec<unknown>[] {
  const entries = Object.values(optionTable) as readonly OptionSpec<unknown>[];
  return entries.filter((entry) => entry.commands.includes(command) && (withFlagOnly || entry.flagOnly !== true));
}

/** Each command's defaults, from the table (the library's and the CLI's). */
export function defaultsFor(command: CommandName): Readonly<Record<string, unknown>> {
  const defaults: Record<string, unknown> = {};
  for (const entry of entriesFor(command)) if (entry.default !== undefined) defaults[entry.name] = entry.default;
  return defaults;
}

/** The schema of one option's value: its kind's, with the default filled in or made optional. */
function fieldSchema(entry: OptionSpec<unknown>): z.ZodMiniType {
  const schema = entry.kind.schema();
  if (entry.default !== undefined) return z._default(schema, entry.default as never);
  if (entry.required === true) return schema;
  return z.optional(schema);
}

/** A rule across options: a zod check on the options object (checked after every value's own rule). */
type Rule = z.core.$ZodCheck<never>;

/** A rule across options, marked so that its refusal is told apart from a value's. */
function across<T>(accept: (options: T) => boolean, params: { readonly path: readonly string[]; readonly message: string }): Rule {
  return z.refine<T>(accept, { path: [...params.path], message: params.message, params: { across: true } }) as Rule;
}

interface ReaderOptions {
  readonly low?: string | undefined;
  readonly high?: string | undefined;
  readonly pair?: readonly unknown[] | undefined;
  readonly lows?: readonly string[] | undefined;
  readonly highs?: readonly string[] | undefined;
  readonly allPairs?: readonly string[] | undefined;
  readonly idColumn?: string | undefined;
  readonly valueColumn?: string | undefined;
  readonly rf?: string | undefined;
  readonly units?: string | undefined;
  readonly allowExtreme?: boolean | undefined;
}

/** A risk-free rate given as a number is within the returns' reach (input/table/convert.ts), as a column's would be. */
function riskFreeInReach(o: ReaderOptions): boolean {
  const rate = o.rf === undefined ? null : parseDecimal(o.rf);
  if (rate === null || o.allowExtreme === true) return true;
  return Math.abs(o.units === "percent" ? rate / 100 : rate) <= EXTREME_LIMIT;
}

/** Rules across options of the commands that read files. */
function readerRules(): Rule[] {
  return [
    across<ReaderOptions>((o) => (o.low === undefined) === (o.high === undefined), {
      path: ["high"],
      message: "--low and --high go together (or use --pair LOW:HIGH)",
    }),
    across<ReaderOptions>((o) => (o.lows === undefined) === (o.highs === undefined), {
      path: ["highs"],
      message: "--lows and --highs go together",
    }),
    across<ReaderOptions>((o) => o.low !== undefined || (o.pair?.length ?? 0) > 0 || o.lows !== undefined || o.allPairs !== undefined, {
      path: ["low"],
      message: "name the books: --low COLUMN --high COLUMN, or --pair LOW:HIGH, or --lows A,B --highs X,Y, or --all-pairs A,B,C",
    }),
    across<ReaderOptions>((o) => o.allPairs === undefined || (o.low === undefined && (o.pair?.length ?? 0) === 0 && o.lows === undefined), {
      path: ["allPairs"],
      message: "--all-pairs orders each pair itself: give it without --low/--high, --pair or --lows/--highs",
    }),
    across<ReaderOptions>((o) => o.allPairs === undefined || new Set(o.allPairs).size >= 2, {
      path: ["allPairs"],
      message: "--all-pairs needs at least two different columns",
    }),
    across<ReaderOptions>(riskFreeInReach, {
      path: ["rf"],
      message: `a risk-free rate as a number is a return per period, held to +-${EXTREME_LIMIT * 100}% as the files' returns are (in percent with --units percent); pass --allow-extreme if it is meant`,
    }),
    across<ReaderOptions>(inputRules.longLayout.accept, {
      path: ["valueColumn"],
      message: refusal(inputRules.longLayout, {}),
    }),
  ];
}

/** b_low < 1/w, so that the high book's structural beta is positive. */
const positiveHighBeta = (): Rule =>
  across<{ lowBeta: number; weight: number }>((o) => o.lowBeta < 1 / o.weight, {
    path: ["lowBeta"],
    message: "must be below 1/w so that the high book's beta is positive",
  });

const rulesAcross: { readonly [C in CommandName]: () => Rule[] } = {
  solve: () => [
    ...readerRules(),
    across<CommandOptions<"solve">>((o) => o.intervalSource !== "bootstrap" || o.bootstrap >= 2, {
      path: ["intervalSource"],
      message: "bootstrap standard errors need --bootstrap with at least 2 replicates",
    }),
    across<CommandOptions<"solve">>((o) => o.hacLags === undefined || o.hacKernel === "bartlett", {
      path: ["hacLags"],
      message: "a fixed lag truncation is the Bartlett kernel's: give --hac-lags with --hac-kernel bartlett (the default), or leave it out",
    }),
    across<CommandOptions<"solve">>((o) => !o.brief || o.format === "text", {
      path: ["brief"],
      message: "--brief shortens the text report: use it with --format text",
    }),
    across<CommandOptions<"solve">>((o) => o.marketWeights === undefined || o.marketWeights.length === o.portfolios?.length, {
      path: ["marketWeights"],
      message: "give one market weight per --portfolios column",
    }),
  ],
  roll: () => [
    ...readerRules(),
    across<CommandOptions<"roll">>((o) => (o.window === undefined) !== !o.expanding, {
      path: ["window"],
      message: "give either --window N (a rolling window) or --expanding (with --min-periods N)",
    }),
    across<CommandOptions<"roll">>((o) => !o.expanding || o.minPeriods !== undefined, {
      path: ["minPeriods"],
      message: `--expanding needs --min-periods N (at least ${minimumObservations})`,
    }),
  ],
  implied: () => [positiveHighBeta()],
  simulate: () => [positiveHighBeta()],
};

const built = new Map<CommandName, z.ZodMiniType>();

/** The schema of `command`'s options: a strict object of the table's fields and the rules across them. */
export function optionsSchema<C extends CommandName>(command: C): z.ZodMiniType<CommandOptions<C>, CommandOptionsInput<C>> {
  let schema = built.get(command);
  if (schema === undefined) {
    const shape = Object.fromEntries(entriesFor(command).map((entry) => [entry.name, fieldSchema(entry)]));
    const checks = rulesAcross[command]() as z.core.$ZodCheck<Record<string, unknown>>[];
    schema = z.strictObject(shape).check(...checks);
    built.set(command, schema);
  }
  return schema as z.ZodMiniType<CommandOptions<C>, CommandOptionsInput<C>>;
}

/**
 * Refused options: a value its rule refuses (`invalid-value`), a name no option has (`unknown-option`),
 * or options that do not go together (`options-conflict`).
 */
export interface OptionIssue {
  readonly code: "invalid-value" | "unknown-option" | "options-conflict";
  /** The option's name (camelCase), or "" for the options object as a whole. */
  readonly option: string;
  /** The value refused, when one value is the problem. */
  readonly value?: string;
  readonly message: string;
}

/** The first problem zod found, as the option it concerns and the message. */
export function optionIssueOf(error: z.core.$ZodError, names: readonly string[] = []): OptionIssue {
  const issue = error.issues[0];
  if (issue?.code === "unrecognized_keys") {
    const near = issue.keys.length === 1 ? closestName(issue.keys[0] ?? "", names) : undefined;
    const hint = near === undefined ? "" : ` (did you mean "${near}"?)`;
    return { code: "unknown-option", option: "", message: `unknown option ${issue.keys.map((k) => `"${k}"`).join(", ")}${hint}` };
  }
  const conflict = issue?.code === "custom" && (issue.params as { across?: boolean } | undefined)?.across === true;
  return {
    code: conflict ? "options-conflict" : "invalid-value",
    option: String(issue?.path[0] ?? ""),
    message: issue?.message ?? "invalid",
  };
}

/** `input` checked against `command`'s options, with every default filled in, or the first problem. */
export function parseOptions<C extends CommandName>(command: C, input: unknown): Result<CommandOptions<C>, OptionIssue> {
  const parsed = optionsSchema(command).safeParse(input);
  return parsed.success
    ? success(parsed.data)
    : failure(
        optionIssueOf(
          parsed.error,
          entriesFor(command).map((e) => e.name),
        ),
      );
}

/** The kebab-case flag of an option name: "hacLags" -> "--hac-lags". */
export const flagOf = (name: string): string => `--${name.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}`;

/** Every command name, for tests and the docs. */
export { commandNames };
