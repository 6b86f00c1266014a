import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { detectDelimiter } from "../../src/input/dialect.js";
import { column, HIGH, LOW, readIssues, readOk } from "./helpers.js";

const rows = ["2020-01-31|0.01|0.02", "2020-02-29|-0.01|0.03", "2020-03-31|0.02|-0.04"];
const file = (delimiter: string, header = `Date|${LOW}|${HIGH}`): string => [header, ...rows].join("\n").replaceAll("|", delimiter);

/** The first implementation (split all lines, count code points): the reference the faster one must equal. */
function referenceDetect(text: string, candidates: readonly string[] = [",", ";", "\t"]): string {
  const head = text.length > 65536 ? text.slice(0, text.lastIndexOf("\n", 65536) + 1 || 65536) : text;
  const lines = head
    .split(/\r\n|\n|\r/)
    .filter((line) => line.trim() !== "")
    .slice(0, 64);
  const countFields = (line: string, delimiter: string): number => {
    let fields = 1;
    let quoted = false;
    for (const char of line) {
      if (char === '"') quoted = !quoted;
      else if (char === delimiter && !quoted) fields++;
    }
    return fields;
  };
  let best = candidates[0] ?? ",";
  let bestScore = 0;
  for (const delimiter of candidates) {
    const tally = new Map<number, number>();
    for (const line of lines) tally.set(countFields(line, delimiter), (tally.get(countFields(line, delimiter)) ?? 0) + 1);
    let mode = { value: 1, frequency: 0 };
    for (const [value, frequency] of tally)
      if (frequency > mode.frequency || (frequency === mode.frequency && value > mode.value)) mode = { value, frequency };
    const score = mode.value >= 2 ? mode.frequency : 0;
    if (score > bestScore) {
      best = delimiter;
      bestScore = score;
    }
  }
  return best;
}

describe("delimiter detection", () => {
  it("equals the reference implementation on generated texts (line breaks, quotes, blank lines, astral characters)", () => {
    const piece = fc.constantFrom(",", ";", "\t", '"', "\n", "\r", "\r\n", " ", "a", "1", "😀", "é", "\n\n", "  \n");
    fc.assert(
      fc.property(fc.array(piece, { maxLength: 400 }), fc.boolean(), (pieces, decimalComma) => {
        const text = pieces.join("");
        const candidates = decimalComma ? [";", "\t"] : undefined;
        expect(detectDelimiter(text, candidates)).toBe(referenceDetect(text, candidates));
      }),
      { seed: 20261208, numRuns: 3000 },
    );
  });

  it.each([
    [",", "comma"],
    [";", "semicolon"],
    ["\t", "tab"],
  ])("detects %j (%s)", (delimiter) => {
    expect(detectDelimiter(file(delimiter))).toBe(delimiter);
    expect(column(readOk(file(delimiter)), HIGH)).toEqual([0.02, 0.03, -0.04]);
  });

  it("prefers semicolons when commas appear only inside values", () => {
    expect(detectDelimiter("Date;A;B\n2020-01-31;1,5;2,5\n2020-02-29;1,25;2\n")).toBe(";");
  });

  it("ignores delimiters inside quotes", () => {
    expect(detectDelimiter('"a;b";c;d\n"1;2";3;4\n"x";5;6\n')).toBe(";");
  });

  it("defaults to comma when nothing splits the lines", () => {
    expect(detectDelimiter("just text\nmore text\n")).toBe(",");
  });

  it("lets the delimiter option override detection", () => {
    const text = "Date|Low Fund|High Fund\n2020-01-31|0.01|0.02\n2020-02-29|0.01|0.03\n2020-03-31|0.02|0.04\n";
    expect(column(readOk(text, { delimiter: "|" }), LOW)).toEqual([0.01, 0.01, 0.02]);
  });

  it("reads CR-only line ends", () => {
    expect(readOk(file(",").replaceAll("\n", "\r")).dates).toEqual(["2020-01-31", "2020-02-29", "2020-03-31"]);
  });
});

describe("title lines and blocks", () => {
  it("skips free-text title lines before the header and warns about them", () => {
    const text = `Harbourline Capital, monthly returns\nGenerated 2024-05-01\n${file(",")}`;
    const table = readOk(text);
    expect(table.dates).toHaveLength(3);
    expect([...table.lines]).toEqual([4, 5, 6]);
    expect(table.warnings).toEqual([{ code: "skipped-lines", source: "returns.csv", line: 3, count: 2 }]);
  });

  it("skips a title block separated by a blank line", () => {
    const table = readOk(`Returns export\n\n${file(",")}\n`);
    expect([...table.lines]).toEqual([4, 5, 6]);
    expect(table.warnings).toEqual([]);
  });

  it("reads the first table by default and warns that there are others", () => {
    const second = "Date,Low Fund,High Fund\n2021-01-31,0.5,0.6\n2021-02-28,0.5,0.6\n2021-03-31,0.5,0.6\n";
    const table = readOk(`${file(",")}\n\n${second}`);
    expect(table.dates[0]).toBe("2020-01-31");
    expect(table.warnings).toContainEqual({ code: "other-blocks", source: "returns.csv", used: 1, blocks: 2 });
  });

  it("reads another table with the block option", () => {
    const second = "Date,Low Fund,High Fund\n2021-01-31,0.05,0.06\n2021-02-28,0.05,0.06\n2021-03-31,0.05,0.06\n";
    const table = readOk(`${file(",")}\n\n${second}`, { block: 2 });
    expect(table.dates).toEqual(["2021-01-31", "2021-02-28", "2021-03-31"]);
    expect([...table.lines]).toEqual([7, 8, 9]);
  });

  it("reports a block number beyond the tables in the file", () => {
    expect(readIssues(file(","), { block: 3 })).toEqual([{ code: "no-such-block", source: "returns.csv", block: 3, available: 1 }]);
  });

  it("points to the table holding a column that the chosen table lacks", () => {
    const summary = "Statistic,Value\nMean,0.01\nVolatility,0.04\n";
    const [issue] = readIssues(`${summary}\n${file(",")}`);
    expect(issue).toMatchObject({ code: "unknown-column", column: LOW, foundInBlock: 2 });
  });

  it("takes the header row that names the requested columns even if data rows are misshapen", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,0.01\n2020-02-29,0.01\n2020-03-31,0.01\n";
    expect(readIssues(text)[0]).toEqual({ code: "wrong-field-count", source: "returns.csv", line: 2, expected: 3, actual: 2 });
  });

  it("reports a header without data below a title line", () => {
    expect(readIssues(`Monthly returns\nDate,${LOW},${HIGH}\n`)).toEqual([{ code: "header-only", source: "returns.csv", line: 2 }]);
  });

  it("accepts empty trailing fields beyond the header", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,0.01,0.02,\n2020-02-29,0.01,0.02,,\n2020-03-31,0.01,0.02\n";
    expect(readOk(text).dates).toHaveLength(3);
  });
});

describe("an unquoted delimiter inside a value", () => {
  it("reports a decimal comma that split a number, naming the column and the joined value", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2020-02-29,0.01,-2,5\n2020-03-31,0.01,0.02\n";
    expect(readIssues(text)).toEqual([
      { code: "unquoted-delimiter", source: "returns.csv", line: 3, column: HIGH, value: "-2,5", delimiter: "," },
    ]);
  });

  it("reports a plain field-count error when no split number explains the extra field", () => {
    const text = "Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2020-02-29,0.01,x,y\n2020-03-31,0.01,0.02\n";
    expect(readIssues(text)).toEqual([{ code: "wrong-field-count", source: "returns.csv", line: 3, expected: 3, actual: 4 }]);
  });

  it("reads quoted decimal commas as text, which is then not a number", () => {
    const text = 'Date,Low Fund,High Fund\n2020-01-31,0.01,0.02\n2020-02-29,0.01,"2,5"\n2020-03-31,0.01,0.02\n';
    expect(readIssues(text)).toEqual([{ code: "not-a-number", source: "returns.csv", line: 3, column: HIGH, value: "2,5" }]);
  });
});

describe("quoted fields", () => {
  it("counts lines correctly after a quoted field with a line break", () => {
    const text = 'Date,Low Fund,High Fund,Note\n2020-01-31,0.01,0.02,"two\nlines"\n2020-02-29,x,0.02,\n2020-03-31,0.01,0.02,\n';
    expect(readIssues(text)).toEqual([{ code: "not-a-number", source: "returns.csv", line: 4, column: LOW, value: "x" }]);
  });
});
