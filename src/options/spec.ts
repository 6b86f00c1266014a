/**
 * What an entry of the option table (table.ts) says about one option, the commands, and the sections
 * the options are shown in.
 */
import type { Kind } from "./kinds.js";

export const commandNames = ["solve", "roll", "implied", "simulate"] as const;
export type CommandName = (typeof commandNames)[number];

/** Sections of the option tables (help and README). */
export const optionGroups = {
  books: "Books",
  reading: "Reading the files",
  model: "Model",
  output: "Output",
  uncertainty: "Uncertainty",
  bootstrap: "Bootstrap",
  windows: "Windows",
  structure: "Structure (per period, decimal)",
  simulation: "Simulation",
} as const;
export type OptionGroup = keyof typeof optionGroups;

/** One option. */
export interface OptionSpec<T> {
  /** The attribute, config key and library field (camelCase); the flag is `--` and its kebab-case form. */
  readonly name: string;
  readonly kind: Kind<T>;
  /** The flag's value placeholder ("<w>", "[replicates]"); absent for a switch. */
  readonly argument?: string;
  readonly help: string;
  readonly group: OptionGroup;
  readonly commands: readonly CommandName[];
  readonly default?: T;
  /** What happens without the option, when that is not a value ("detected", "the first column"). */
  readonly otherwise?: string;
  /** Must be given (there is no sensible default). */
  readonly required?: true;
  /** The value of the flag given without one (`--bootstrap` alone). */
  readonly preset?: T;
  /** A switch written `--no-<flag>` on the command line (its default is on). */
  readonly negated?: true;
  /** A path: in a config file, relative to the file's folder. */
  readonly path?: true;
  /** Not a config key (`--config` itself). */
  readonly flagOnly?: true;
}

/** An entry of the table, with its literal types kept (name, commands, whether it has a default). */
export function option<T, const S extends Omit<OptionSpec<T>, "kind">>(kind: Kind<T>, spec: S): S & { readonly kind: Kind<T> } {
  return { ...spec, kind };
}

export const readers = ["solve", "roll"] as const;
export const everyCommand = commandNames;
export const structureCommands = ["implied", "simulate"] as const;
