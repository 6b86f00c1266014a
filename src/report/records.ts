/**
 * Several (file, pair) results in one output: JSON Lines (one compact record per line, full solve
 * documents or failure records, so shards concatenate into one valid stream), CSV (the grid and
 * landmark rows of every record, prefixed by its file and pair) and text (the reports in order).
 */

import { candidateRow, csvField, csvHeader, csvText, namedCandidates } from "./csv.js";
import { assertJsonSafe, schemaVersion, toSolveOutput } from "./json.js";
import type { SolveFailureJson, SolveOutputJson } from "../schema/solveOutput.js";
import { styleFor } from "./layout.js";
import { renderText } from "./text/text.js";
import { type ComparedPair, comparisonLines } from "./text/textComparison.js";
import type { RenderOptions, SolveReport } from "./types.js";

/** A (file, pair) that could not be solved, with the stable codes and messages of what stopped it. */
export interface SolveFailure {
  readonly tool: SolveReport["tool"];
  readonly source: string;
  readonly lowColumn: string;
  readonly highColumn: string;
  readonly errors: readonly { readonly code: string; readonly message: string }[];
}

export type SolveRecord =
  | { readonly kind: "report"; readonly report: SolveReport }
  | { readonly kind: "failure"; readonly failure: SolveFailure };

export function failureOutput(failure: SolveFailure): SolveFailureJson {
  return {
    schemaVersion,
    tool: { name: failure.tool.name, version: failure.tool.version },
    status: "failed" as const,
    input: { source: failure.source, lowColumn: failure.lowColumn, highColumn: failure.highColumn },
    errors: failure.errors.map((e) => ({ code: e.code, message: e.message })),
  };
}

export function renderJsonLines(records: readonly SolveRecord[]): string {
  return renderDocumentLines(
    records.map((record) => {
      const output = record.kind === "report" ? toSolveOutput(record.report) : failureOutput(record.failure);
      assertJsonSafe(output);
      return output;
    }),
  );
}

/** JSON Lines of documents already made and checked (as the solve job's are): one line each. */
export function renderDocumentLines(documents: readonly (SolveOutputJson | SolveFailureJson)[]): string {
  return documentLinePieces(documents).join("");
}

/**
 * The same JSON Lines as pieces to write in order (each document's line, then its line feed), for an
 * output that takes pieces: a batch's lines are never joined into one string of megabytes.
 */
export function documentLinePieces(documents: readonly (SolveOutputJson | SolveFailureJson)[]): string[] {
  const pieces: string[] = [];
  for (const document of documents) pieces.push(JSON.stringify(document), "\n");
  return pieces;
}

/** One CSV table: `source,lowColumn,highColumn` then the candidate columns; failed pairs have no rows. */
export function renderRecordsCsv(records: readonly SolveRecord[]): string {
  const header = ["source", "lowColumn", "highColumn", ...csvHeader].map(csvField).join(",");
  const lines = [header];
  for (const record of records) {
    if (record.kind !== "report" || record.report.solution.bounds === null) continue;
    const { input, solution } = record.report;
    const prefix = [input.source, input.lowColumn, input.highColumn].map(csvText).join(",");
    for (const [point, candidate] of namedCandidates(solution.grid, solution.landmarks))
      lines.push(`${prefix},${candidateRow(point, candidate)}`);
  }
  return `${lines.join("\n")}\n`;
}

/**
 * The comparison table of every pair, then the text reports one after another, with each failure
 * stated where its report would be.
 */
export function renderRecordsText(records: readonly SolveRecord[], options: RenderOptions): string {
  const rule = `${"=".repeat(96)}\n`;
  const compared = records.map((record): ComparedPair => {
    if (record.kind === "report") return record;
    const f = record.failure;
    return { kind: "failure", source: f.source, lowColumn: f.lowColumn, highColumn: f.highColumn, codes: f.errors.map((e) => e.code) };
  });
  const table = comparisonLines(compared, styleFor(options));
  const head = table.length === 0 ? "" : `${table.join("\n")}\n\n${rule}\n`;
  return (
    head +
    records
      .map((record) => {
        if (record.kind === "report") return renderText(record.report, options);
        const f = record.failure;
        return `${f.source}: low "${f.lowColumn}", high "${f.highColumn}": not solved\n${f.errors.map((e) => `  ${e.message}\n`).join("")}`;
      })
      .join(`\n${rule}\n`)
  );
}
