/**
 * A config file (`--config FILE`): a JSON object whose keys are option names (camelCase, as in the
 * option table) plus `files`. Each value is checked by its option's own kind, so it is refused in the
 * same words as the flag; an unknown key is refused with the nearest known one. A key of another
 * command only (roll's `window` given to solve) is refused too, naming that command: at the top
 * level it would be ignored, and a near miss ("step" for solve's "steps") would pass unseen. A file
 * shared by commands keeps such keys under the command's name (`"roll": {"window": 60}`): the
 * running command reads its own section over the top-level keys, and checks the others' sections
 * against their commands. Pure: text in, values out.
 */
import * as z from "zod/mini";
import { failure, type Result, success } from "../core/result.js";
import { closestName } from "../input/index.js";
import { textKind } from "./kinds.js";
import { entriesFor } from "./schemas.js";
import { type CommandName, commandNames, type OptionSpec, optionTable } from "./table.js";

/** What a config file holds for one command: its files (if any) and option values by name. */
export interface ConfigContents {
  readonly files?: readonly string[];
  readonly values: Readonly<Record<string, unknown>>;
}

/** Where in the file a problem is ("weight", "pair.0"; "" for the whole file) and what it is. */
export interface ConfigProblem {
  readonly at: string;
  readonly reason: string;
}

/** Every key a config file may hold, for any command. */
function knownKeys(): string[] {
  const names = (Object.values(optionTable) as readonly OptionSpec<unknown>[]).filter((e) => e.flagOnly !== true).map((e) => e.name);
  return ["files", ...new Set(names)];
}

const schemas = new Map<CommandName, z.ZodMiniType>();

/** The schema of a config file for `command`: its options' kinds (other keys are refused). */
function configSchema(command: CommandName): z.ZodMiniType {
  let schema = schemas.get(command);
  if (schema === undefined) {
    const shape: Record<string, z.ZodMiniType> = {};
    for (const entry of entriesFor(command)) shape[entry.name] = z.optional(entry.kind.schema());
    const file = textKind("a file path").schema();
    shape.files = z.optional(z.array(file).check(z.minLength(1, { error: "must list at least one file" })));
    schema = z.strictObject(shape);
    schemas.set(command, schema);
  }
  return schema;
}

/** The JSON object of a config file's text. */
export function configObject(text: string): Result<Record<string, unknown>, ConfigProblem> {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (error) {
    // The parser's message quotes the text; a file that is not a config (a system file named by
    // mistake) must not be echoed, so only the position is kept.
    const position = /position (\d+)/.exec(error instanceof Error ? error.message : "")?.[1];
    return failure({ at: "", reason: `not valid JSON${position === undefined ? "" : ` (at character ${position})`}` });
  }
  if (typeof data !== "object" || data === null || Array.isArray(data)) return failure({ at: "", reason: "must be a JSON object" });
  return success(data as Record<string, unknown>);
}

/** The commands that read a config file, whose names are also the keys of their sections. */
const sectionNames = (): CommandName[] =>
  commandNames.filter((c) => entriesFor(c, { withFlagOnly: true }).some((e) => e.name === "config"));

/** Whether `key` names a command's section of a shared file. */
export const isSection = (key: string): boolean => (sectionNames() as string[]).includes(key);

/**
 * The keys `command` reads from a file that may have sections: the top-level keys with its own
 * section's over them. Every section must hold only its command's keys, checked as that command
 * would check them (a problem is named by its place, "roll.window"), so a shared file's mistake is
 * found by whichever command runs first.
 */
export function ownSection(data: Record<string, unknown>, command: CommandName): Result<Record<string, unknown>, ConfigProblem> {
  const top: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(data)) if (!isSection(key)) top[key] = value;
  for (const name of sectionNames()) {
    const section = data[name];
    if (section === undefined) continue;
    if (typeof section !== "object" || section === null || Array.isArray(section))
      return failure({ at: name, reason: `must be a JSON object of ${name}'s keys` });
    const nested = Object.keys(section).find((key) => key === "jobs" || key === "files" || isSection(key));
    if (nested !== undefined)
      return failure({ at: `${name}.${nested}`, reason: "belongs at the top level (a section holds options only)" });
    const checked = checkKeys(section as Record<string, unknown>, name);
    if (!checked.ok) return failure({ at: `${name}.${checked.issues.at}`, reason: checked.issues.reason });
  }
  const own = data[command];
  return success(own === undefined ? top : { ...top, ...(own as Record<string, unknown>) });
}

/** The commands an option of that name belongs to, other than `command`. */
function otherCommands(key: string, command: CommandName): CommandName[] {
  const entries = (Object.values(optionTable) as readonly OptionSpec<unknown>[]).filter((e) => e.name === key && e.flagOnly !== true);
  return [...new Set(entries.flatMap((e) => e.commands))].filter((c) => c !== command);
}

/** Checks a config object's keys and values for `command` (sections already resolved). */
function checkKeys(data: Record<string, unknown>, command: CommandName): Result<ConfigContents, ConfigProblem> {
  const own = ["files", ...entriesFor(command).map((e) => e.name)];
  const foreign = Object.keys(data).find((key) => !own.includes(key) && otherCommands(key, command).length > 0);
  if (foreign !== undefined) {
    const owners = otherCommands(foreign, command);
    const section = owners.find(isSection);
    const share = section === undefined ? "" : `, or keep it under "${section}": {...} to share the file with ${section}`;
    return failure({ at: foreign, reason: `a key of ${owners.join(" and ")}, not of ${command}: remove it${share}` });
  }
  const parsed = configSchema(command).safeParse(data);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    if (issue?.code === "unrecognized_keys") {
      const key = issue.keys[0] ?? "";
      // The command's own keys first: another command's key would be refused here too.
      const near = closestName(key, own) ?? closestName(key, knownKeys());
      return failure({ at: key, reason: `unknown key${near === undefined ? "" : ` (did you mean "${near}"?)`}` });
    }
    return failure({ at: (issue?.path ?? []).map(String).join("."), reason: issue?.message ?? "invalid" });
  }
  const { files, ...rest } = parsed.data as { files?: string[] } & Record<string, unknown>;
  const values = Object.fromEntries(Object.entries(rest).filter(([key, value]) => own.includes(key) && value !== undefined));
  return success(files === undefined ? { values } : { files, values });
}

/** Reads a config object for `command`: its own section over the top-level keys, then every key checked. */
export function parseConfigObject(data: Record<string, unknown>, command: CommandName): Result<ConfigContents, ConfigProblem> {
  const keys = ownSection(data, command);
  return keys.ok ? checkKeys(keys.value, command) : keys;
}

/** Reads a config file's text for `command`. */
export function parseConfig(text: string, command: CommandName): Result<ConfigContents, ConfigProblem> {
  const data = configObject(text);
  return data.ok ? parseConfigObject(data.value, command) : data;
}

/** The options of `command` that name files (relative to the config file's folder when written there). */
export function pathOptions(command: CommandName): string[] {
  return entriesFor(command)
    .filter((e) => e.path === true)
    .map((e) => e.name);
}
