/**
 * Every option of every command, defined once: its name (the camelCase attribute, config key and
 * library field; the flag is its kebab-case form), the kind of value and its rule, the default, the
 * help text and the commands that take it. Commander's options (src/cli/commandOptions.ts), the zod
 * schemas of flags, config files and library calls (schemas.ts, config.ts), the README's option
 * tables (docs.ts) and the library's defaults (schemas.ts) are all generated from this table.
 *
 * An entry's key is unique; two entries may share a `name` when they never share a command (`format`
 * has other choices for each command), and a test checks that. The entries are written in parts
 * (table/*.ts), by section.
 */
import { generatorOptions } from "./table/generators.js";
import { inferenceOptions } from "./table/inference.js";
import { inputOptions } from "./table/books.js";
import { modelOptions } from "./table/models.js";
import { reportOptions } from "./table/outputs.js";

export { type CommandName, commandNames, type OptionGroup, type OptionSpec, optionGroups } from "./spec.js";

/** Every option, in the order help and the README show them. */
export const optionTable = { ...inputOptions, ...reportOptions, ...modelOptions, ...inferenceOptions, ...generatorOptions } as const;

/** The parts, for a test that no key of one hides a key of another. */
export const optionTableParts = [inputOptions, reportOptions, modelOptions, inferenceOptions, generatorOptions] as const;

export type OptionTable = typeof optionTable;
export type OptionKey = keyof OptionTable;
