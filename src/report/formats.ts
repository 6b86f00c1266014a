/** The output formats of each command, in one place (the option table and the renderers use them). */

/** One report of one result. */
export const reportFormats = ["text", "json", "csv"] as const;
export type ReportFormat = (typeof reportFormats)[number];

/** solve: a report, one record per line for several files and pairs (jsonl), or one CSV row per pair (summary-csv). */
export const solveFormats = [...reportFormats, "jsonl", "summary-csv"] as const;

/** roll: a table, one CSV row per window, or one JSON record per window. */
export const rollFormats = ["text", "csv", "jsonl"] as const;

/** implied: the report formats of solve. */
export const impliedFormats = reportFormats;

/** simulate: a CSV that solve reads as it is, or JSON Lines. */
export const simulateFormats = ["csv", "jsonl"] as const;
