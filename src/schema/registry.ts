/**
 * The metadata registry of the output schema: descriptions and $defs names for the generated JSON
 * Schema. A registry of our own (not zod's global one), so loading the schema twice can never clash.
 */

import * as z from "zod";

export interface SchemaMeta {
  readonly id?: string;
  readonly description?: string;
}

export const outputRegistry = z.registry<SchemaMeta>();

/** Registers a description (and, for shared parts, a $defs name) for `schema`; returns the schema. */
export function doc<T extends z.ZodType>(schema: T, description: string, id?: string): T {
  outputRegistry.add(schema as z.ZodType, id === undefined ? { description } : { id, description });
  return schema;
}
