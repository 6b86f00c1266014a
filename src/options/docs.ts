/**
 * The README's option tables, generated from the option table so they cannot drift from the flags.
 * A block in the README between `<!-- options: COMMAND GROUP,GROUP -->` and `<!-- end options -->` is
 * replaced by the table of those groups; `test/options/docs.test.ts` checks the README is current and
 * rewrites it when asked (`npm run docs`).
 */
import { entriesFor, flagOf } from "./schemas.js";
import { type CommandName, commandNames, type OptionGroup, type OptionSpec, optionGroups } from "./table.js";

const cell = (text: string): string => text.replaceAll("|", "\\|");

function flagCell(entry: OptionSpec<unknown>): string {
  const flag = flagOf(entry.name);
  if (entry.argument === undefined) return entry.negated === true ? `--no-${flag.slice(2)}` : flag;
  return `${flag} ${entry.argument}`;
}

function defaultCell(entry: OptionSpec<unknown>): string {
  if (entry.required === true) return "required";
  if (entry.negated === true) return "on";
  const preset = entry.preset === undefined ? "" : ` (${entry.kind.show(entry.preset)} when given without a value)`;
  if (entry.default !== undefined) return entry.kind.show(entry.default) + preset;
  return entry.otherwise ?? "";
}

function choicesOf(entry: OptionSpec<unknown>): string {
  const kind = entry.kind as { readonly choices?: readonly string[] };
  return kind.choices === undefined ? "" : ` (${kind.choices.join(", ")})`;
}

/** The Markdown table of `command`'s options in `groups` (all groups when none are named). */
export function optionTableMarkdown(command: CommandName, groups: readonly OptionGroup[] = []): string {
  const entries = entriesFor(command, { withFlagOnly: true });
  // A config key column only for the commands that read a config file.
  const configurable = entries.some((entry) => entry.name === "config");
  const rows = entries
    .filter((entry) => groups.length === 0 || groups.includes(entry.group))
    .map((entry) => {
      const key = entry.flagOnly === true ? "" : `\`${entry.name}\``;
      const cells = [
        `\`${cell(flagCell(entry))}\``,
        ...(configurable ? [key] : []),
        cell(entry.help + choicesOf(entry)),
        cell(defaultCell(entry)),
      ];
      return `| ${cells.join(" | ")} |`;
    });
  const head = configurable ? ["option", "config key", "meaning", "default"] : ["option", "meaning", "default"];
  return [`| ${head.join(" | ")} |`, `|${" --- |".repeat(head.length)}`, ...rows].join("\n");
}

const block = /<!-- options: ([a-z]+)(?: ([a-z,]+))? -->\n[\s\S]*?<!-- end options -->/g;

/** `readme` with every options block regenerated; a block naming an unknown command or group is an error. */
export function updateOptionDocs(readme: string): string {
  return readme.replace(block, (whole, command: string, groupList: string | undefined) => {
    const groups = (groupList ?? "").split(",").filter((g) => g !== "");
    if (!(commandNames as readonly string[]).includes(command) || !groups.every((g) => g in optionGroups)) {
      throw new Error(`README options block names an unknown command or group: ${whole.split("\n")[0]}`);
    }
    const head = `<!-- options: ${command}${groupList === undefined ? "" : ` ${groupList}`} -->`;
    return `${head}\n${optionTableMarkdown(command as CommandName, groups as OptionGroup[])}\n<!-- end options -->`;
  });
}
