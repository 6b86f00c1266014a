/**
 * A small JSON Schema (draft 2020-12) validator for the keywords the generated output schema uses,
 * so the tests can check real output against the JSON Schema itself (not only against zod). An
 * unknown keyword is an error: the test then says the validator must learn it, instead of passing.
 */

type Schema = Record<string, unknown>;

const annotations = new Set(["$schema", "$defs", "description", "readOnly", "title"]);
const known = new Set([
  ...annotations,
  "$ref",
  "type",
  "properties",
  "required",
  "additionalProperties",
  "items",
  "anyOf",
  "oneOf",
  "const",
  "enum",
  "minimum",
  "maximum",
  "exclusiveMinimum",
  "exclusiveMaximum",
]);

function typeOf(value: unknown): string {
  if (value === null) return "null";
  if (Array.isArray(value)) return "array";
  if (typeof value === "number") return Number.isInteger(value) ? "integer" : "number";
  return typeof value;
}

const hasType = (value: unknown, type: string): boolean => typeOf(value) === type || (type === "number" && typeOf(value) === "integer");

/** Returns the validation errors of `value` against `schema` (empty when valid). */
export function validate(root: Schema, value: unknown, schema: Schema = root, path = "$"): string[] {
  for (const key of Object.keys(schema)) if (!known.has(key)) throw new Error(`validator does not know keyword ${key} at ${path}`);
  const errors: string[] = [];
  const fail = (message: string) => errors.push(`${path}: ${message}`);
  if (typeof schema.$ref === "string") {
    const name = /^#\/\$defs\/(.+)$/.exec(schema.$ref)?.[1];
    const target = name === undefined ? undefined : (root.$defs as Record<string, Schema> | undefined)?.[name];
    if (target === undefined) throw new Error(`unresolvable $ref ${schema.$ref}`);
    errors.push(...validate(root, value, target, path));
  }
  if (schema.type !== undefined) {
    const types = Array.isArray(schema.type) ? (schema.type as string[]) : [schema.type as string];
    if (!types.some((t) => hasType(value, t))) fail(`expected ${types.join(" or ")}, got ${typeOf(value)}`);
  }
  if ("const" in schema && value !== schema.const) fail(`expected ${JSON.stringify(schema.const)}`);
  if (Array.isArray(schema.enum) && !schema.enum.includes(value)) fail(`not one of ${JSON.stringify(schema.enum)}`);
  if (typeof value === "number") {
    if (typeof schema.minimum === "number" && value < schema.minimum) fail(`below ${schema.minimum}`);
    if (typeof schema.maximum === "number" && value > schema.maximum) fail(`above ${schema.maximum}`);
    if (typeof schema.exclusiveMinimum === "number" && value <= schema.exclusiveMinimum) fail(`not above ${schema.exclusiveMinimum}`);
    if (typeof schema.exclusiveMaximum === "number" && value >= schema.exclusiveMaximum) fail(`not below ${schema.exclusiveMaximum}`);
  }
  if (typeOf(value) === "object") {
    const object = value as Record<string, unknown>;
    const properties = (schema.properties ?? {}) as Record<string, Schema>;
    for (const key of (schema.required ?? []) as string[]) if (!(key in object)) fail(`missing ${key}`);
    for (const [key, item] of Object.entries(object)) {
      if (key in properties) errors.push(...validate(root, item, properties[key]!, `${path}.${key}`));
      else if (schema.additionalProperties === false) fail(`unexpected property ${key}`);
    }
  }
  if (Array.isArray(value) && schema.items !== undefined) {
    value.forEach((item, i) => errors.push(...validate(root, item, schema.items as Schema, `${path}[${i}]`)));
  }
  if (Array.isArray(schema.anyOf)) {
    const results = (schema.anyOf as Schema[]).map((s) => validate(root, value, s, path));
    if (!results.some((r) => r.length === 0)) fail(`matches no anyOf branch (${results.flat().join("; ")})`);
  }
  if (Array.isArray(schema.oneOf)) {
    const matches = (schema.oneOf as Schema[]).filter((s) => validate(root, value, s, path).length === 0).length;
    if (matches !== 1) fail(`matches ${matches} oneOf branches, not exactly 1`);
  }
  return errors;
}
