/**
 * Commander options generated from the option table (src/options/table.ts): the flag, its value
 * placeholder, help, default (or what happens without it), preset and whether it is required. Each
 * value is read by its kind, so a refusal says "must be <expected>" as the config file and the
 * library do.
 */
import { type Command, InvalidArgumentError, Option } from "commander";
import { type CommandName, entriesFor, flagOf, type OptionSpec, optionGroups, refusalOf } from "../options/index.js";

function commanderOption(entry: OptionSpec<unknown>): Option {
  return flagOption(entry).helpGroup(`${optionGroups[entry.group]}:`);
}

function flagOption(entry: OptionSpec<unknown>): Option {
  const flag = flagOf(entry.name);
  if (entry.argument === undefined) {
    // A switch: `--x` (off unless given), or `--no-x` for one that is on unless turned off.
    const option = new Option(entry.negated === true ? `--no-${flag.slice(2)}` : flag, entry.help);
    return entry.negated === true ? option : option.default(entry.default ?? false, entry.kind.show(entry.default ?? false));
  }
  // Commander shows a default only when there is a value: what happens otherwise goes in the help.
  const help = entry.default === undefined && entry.otherwise !== undefined ? `${entry.help} (default: ${entry.otherwise})` : entry.help;
  const option = new Option(`${flag} ${entry.argument}`, help);
  const choices = (entry.kind as { readonly choices?: readonly string[] }).choices;
  // Choices first (shown in help), then the kind's parser, which replaces commander's own check.
  if (choices !== undefined) option.choices(choices);
  option.argParser((text: string, previous: unknown) => {
    const value = entry.kind.parse(text, previous);
    if (value === undefined) throw new InvalidArgumentError(refusalOf(entry.kind, text));
    return value;
  });
  if (entry.default !== undefined) option.default(entry.default, entry.kind.show(entry.default));
  if (entry.preset !== undefined) option.preset(entry.preset);
  if (entry.required === true) option.makeOptionMandatory();
  return option;
}

/** Adds every option `name` takes, in table order. */
export function addTableOptions(command: Command, name: CommandName): Command {
  for (const entry of entriesFor(name, { withFlagOnly: true })) command.addOption(commanderOption(entry));
  return command;
}
