/** fast-check generators of return tables and of the text of files holding them. */
import fc from "fast-check";

export interface GeneratedTable {
  readonly names: readonly string[];
  readonly dates: readonly string[];
  readonly values: readonly (readonly number[])[]; // values[row][column]
}

export interface Dialect {
  readonly delimiter: "," | ";" | "\t";
  readonly lineEnd: "\n" | "\r\n";
  readonly quoteAll: boolean;
  readonly bom: boolean;
  readonly titles: readonly string[];
  readonly trailingBlankLines: number;
}

const DAY_MS = 86_400_000;

/** A finite return that String() writes in plain notation or with an exponent. */
export const returnValue = fc.oneof(
  fc.double({ min: -10, max: 10, noNaN: true }),
  fc.integer({ min: -999_999, max: 999_999 }).map((n) => n / 1e6),
  fc.constantFrom(0, -0, 1e-7, -2.5e-12, 0.1, 5e-324),
);

const columnName = fc.stringMatching(/^[A-Za-z][A-Za-z0-9 _-]{0,11}[A-Za-z0-9]$/);

export const generatedTable: fc.Arbitrary<GeneratedTable> = fc
  .record({
    names: fc.uniqueArray(columnName, { minLength: 1, maxLength: 4, selector: (n) => n.trim() }).filter((ns) => !ns.includes("Date")),
    start: fc.integer({ min: 0, max: 40_000 }),
    gaps: fc.array(fc.integer({ min: 1, max: 40 }), { minLength: 3, maxLength: 30 }),
  })
  .chain(({ names, start, gaps }) => {
    let day = start;
    const dates = [start, ...gaps.map((g) => (day += g))].map((d) => new Date(d * DAY_MS).toISOString().slice(0, 10));
    return fc
      .array(fc.array(returnValue, { minLength: names.length, maxLength: names.length }), {
        minLength: dates.length,
        maxLength: dates.length,
      })
      .map((values) => ({ names, dates, values }));
  });

export const dialect: fc.Arbitrary<Dialect> = fc.record({
  delimiter: fc.constantFrom(",", ";", "\t"),
  lineEnd: fc.constantFrom("\n", "\r\n"),
  quoteAll: fc.boolean(),
  bom: fc.boolean(),
  titles: fc.array(fc.constantFrom("Monthly returns", "Exported 2024", "Portfolio report (net)"), { maxLength: 2 }),
  trailingBlankLines: fc.integer({ min: 0, max: 2 }),
});

/** The text of a file holding the table, with numbers written by String (which round-trips). */
export function writeTable(table: GeneratedTable, d: Dialect): string {
  const cell = (text: string): string => (d.quoteAll ? `"${text}"` : text);
  const lines = [
    ...d.titles,
    ["Date", ...table.names].map(cell).join(d.delimiter),
    ...table.dates.map((date, r) => [date, ...(table.values[r] ?? []).map((v) => String(v))].map(cell).join(d.delimiter)),
  ];
  return `${d.bom ? "\uFEFF" : ""}${lines.join(d.lineEnd)}${d.lineEnd.repeat(d.trailingBlankLines + 1)}`;
}

/** The table in the long layout (Date, Series, Value), rows shuffled by a seeded permutation. */
export function writeLongTable(table: GeneratedTable, seed: number, delimiter: string): string {
  const rows = table.dates.flatMap((date, r) => table.names.map((name, c) => [date, name, String(table.values[r]?.[c])].join(delimiter)));
  let state = seed >>> 0;
  for (let i = rows.length - 1; i > 0; i--) {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    const j = state % (i + 1);
    [rows[i], rows[j]] = [rows[j] as string, rows[i] as string];
  }
  return [["Date", "Series", "Value"].join(delimiter), ...rows].join("\n");
}

const MUTATION_ALPHABET = ["0", "1", "9", ".", "-", "e", ",", ";", "\t", " ", "\n", "\r", '"', "N", "A", "/", "\u0000", "é", "\uFEFF"];

/** Random edits (insert, delete, replace) of a text, with characters that matter to a CSV reader. */
export function mutated(text: fc.Arbitrary<string>): fc.Arbitrary<string> {
  const edit = fc.record({
    at: fc.nat(),
    remove: fc.integer({ min: 0, max: 3 }),
    insert: fc.array(fc.constantFrom(...MUTATION_ALPHABET), { maxLength: 3 }),
  });
  return fc.tuple(text, fc.array(edit, { minLength: 1, maxLength: 6 })).map(([t, edits]) =>
    edits.reduce((s, e) => {
      const at = s.length === 0 ? 0 : e.at % (s.length + 1);
      return s.slice(0, at) + e.insert.join("") + s.slice(at + e.remove);
    }, t),
  );
}
