/**
 * The built executable names the file's own line, column and value for a fault in a long price file
 * (the date column second, month-name dates, a title line) and in a wide file under a title line;
 * a date that cannot be read is answered with the layouts that read it. Fixtures: test/fixtures/input
 * (invented data); each fault's line is found by searching the file's text.
 */
import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { compileDateFormat } from "../../src/input/values/dateFormat.js";

const root = new URL("../../", import.meta.url).pathname;
const cli = join(root, "dist/cli.cjs");
const fixture = (name: string): string => join(root, "test/fixtures/input", name);
const LOW = "Stillwater Low Vol";
const HIGH = "Kestrel High Beta";
const LONG = ["--id-column", "symbol", "--value-column", "close", "--input", "prices"];

/** The 1-based lines of a fixture that include `part`. */
const linesWith = (name: string, part: string): number[] =>
  readFileSync(fixture(name), "utf8")
    .split("\n")
    .flatMap((line, k) => (line.includes(part) ? [k + 1] : []));

/** `solve` on a fixture: exit 2, nothing on stdout, the error lines on stderr. */
function refuse(name: string, extra: string[] = []): string[] {
  const result = spawnSync(process.execPath, [cli, "solve", fixture(name), "--low", LOW, "--high", HIGH, ...extra], {
    encoding: "utf8",
    env: { ...process.env, NO_COLOR: "1" },
  });
  expect(result.status).toBe(2);
  expect(result.stdout).toBe("");
  return result.stderr.trimEnd().split("\n");
}

describe("faults named at the file's own lines", () => {
  it("long layout: a price that is not positive, on the second series' own row", () => {
    const [line] = linesWith("long-prices-bad-price.csv", `${HIGH},Jan 9 2023,0.00`);
    expect(refuse("long-prices-bad-price.csv", LONG)).toEqual([
      `error: ${fixture("long-prices-bad-price.csv")} line ${line}, column "close" (series "${HIGH}"): the price "0.00" is not positive, so no return can be computed from it; check the column or the --input setting`,
    ]);
  });

  it("long layout: a date that is no date", () => {
    const [line] = linesWith("long-prices-bad-date.csv", "Jan 32 2023");
    expect(refuse("long-prices-bad-date.csv", LONG)).toEqual([
      `error: ${fixture("long-prices-bad-date.csv")} line ${line}, column "date": "Jan 32 2023" is not a real date: there is no day 32; correct it in the file`,
    ]);
  });

  it("long layout: repeated bad dates, the first few in full and the rest counted with their lines", () => {
    const lines = linesWith("long-prices-bad-dates.csv", "Jam ");
    const stderr = refuse("long-prices-bad-dates.csv", LONG);
    const shown = stderr.slice(0, -1).map((message) => Number(/ line (\d+), column "date": "Jam /.exec(message)?.[1]));
    expect(shown).toEqual(lines.slice(0, shown.length));
    expect(stderr.at(-1)).toBe(
      `error: ${fixture("long-prices-bad-dates.csv")} column "date": … and ${lines.length - shown.length} more dates that cannot be read, on lines ${lines[shown.length]} to ${lines.at(-1)}`,
    );
  });

  it("long layout read in a layout that does not fit: the layouts that do, checked by the layout parser", () => {
    const [first] = refuse("long-prices-month-names.csv", [...LONG, "--date-format", "DD.MM.YYYY"]);
    const [line] = linesWith("long-prices-month-names.csv", `${LOW},Jan 3 2023,`);
    expect(first).toContain(`line ${line}, column "date": "Jan 3 2023" is not a date in the layout DD.MM.YYYY;`);
    const [, layout, iso] = / with --date-format "([^"]+)" \(([^)]+)\)/.exec(first as string) ?? expect.fail(first);
    const parse = compileDateFormat(layout as string);
    if (typeof parse === "string") expect.fail(parse);
    expect(parse("Jan 3 2023")?.iso).toBe(iso);
  });

  it("wide layout under a title line: a value that is not a number", () => {
    const [line] = linesWith("wide-title-bad-value.csv", "0.0x20");
    expect(refuse("wide-title-bad-value.csv")).toEqual([
      `error: ${fixture("wide-title-bad-value.csv")} line ${line}, column "${HIGH}": "0.0x20" is not a number; use an empty field or NA for a missing value, or --missing to declare a sentinel`,
    ]);
  });
});
