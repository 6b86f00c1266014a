/**
 * A config file (`--config FILE`): a JSON object whose keys are option names (camelCase, as in the
 * option table) plus `files`. Each value is checked by its option's own kind, so it is refused in the
 * same words as the flag; keys of other commands are accepted and ignored (one file may serve `solve`
 * and `roll`); an unknown key is refused with the nearest known one. Pure: text in, values out.
 */
import * as z from "zod/mini";
import { failure, type Result, success } from "../core/result.js";
import { closestName } from "../input/index.js";
import { textKind } from "./kinds.js";
import { entriesFor } from "./schemas.js";
import { type CommandName, type OptionSpec, optionTable } from "./table.js";

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

/** The schema of a config file for `command`: its options' kinds, any value for other commands' keys. */
function configSchema(command: CommandName): z.ZodMiniType {
  let schema = schemas.get(command);
  if (schema === undefined) {
    const shape: Record<string, z.ZodMiniType> = Object.fromEntries(knownKeys().map((key) => [key, z.optional(z.unknown())]));
    for (const entry of entriesFor(command)) shape[entry.name] = z.optional(entry.kind.schema());
    const file = textKind("a file path").schema();
    shape.files = z.optional(z.array(file).check(z.minLength(1, { error: "must list at least one file" })));
    schema = z.strictObject(shape);
    schemas.set(command, schema);
  }
  return schema;
}

/** Reads a config file's text for `command`. */
export function parseConfig(text: string, command: CommandName): Result<ConfigContents, ConfigProblem> {
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
  const parsed = configSchema(command).safeParse(data);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    if (issue?.code === "unrecognized_keys") {
      const key = issue.keys[0] ?? "";
      // The command's own keys first: a near miss of another command's key would be ignored here.
      const own = ["files", ...entriesFor(command).map((e) => e.name)];
      const near = closestName(key, own) ?? closestName(key, knownKeys());
      return failure({ at: key, reason: `unknown key${near === undefined ? "" : ` (did you mean "${near}"?)`}` });
    }
    return failure({ at: (issue?.path ?? []).map(String).join("."), reason: issue?.message ?? "invalid" });
  }
  const { files, ...rest } = parsed.data as { files?: string[] } & Record<string, unknown>;
  const names = new Set(entriesFor(command).map((e) => e.name));
  const values = Object.fromEntries(Object.entries(rest).filter(([key, value]) => names.has(key) && value !== undefined));
  return success(files === undefined ? { values } : { files, values });
}

/** The options of `command` that name files (relative to the config file's folder when written there). */
export function pathOptions(command: CommandName): string[] {
  return entriesFor(command)
    .filter((e) => e.path === true)
    .map((e) => e.name);
}
