/**
 * How a pair's table was read, for the report's input description: the layout, what the numbers
 * were, the table of the file, and the rows used and consumed beside those read and dropped.
 */
import type { InputDescription } from "../report/types.js";
import type { CommandOptions } from "../options/index.js";

type Provenance = Pick<InputDescription, "layout" | "inputKind" | "block" | "rowsUsed" | "rowsConsumed">;

/**
 * `observations`: the rows used; `files`: how many files were read (2 when joined on date). A price
 * series gives no return on its first row: that row is consumed, once per file.
 */
export function provenanceOf(
  options: Pick<CommandOptions<"solve">, "input" | "idColumn" | "valueColumn" | "block">,
  observations: number,
  files: number,
): Provenance {
  const inputKind = options.input ?? "returns";
  return {
    layout: options.idColumn !== undefined && options.valueColumn !== undefined ? "long" : "wide",
    inputKind,
    block: options.block ?? 1,
    rowsUsed: observations,
    rowsConsumed: inputKind === "prices" ? files : 0,
  };
}
