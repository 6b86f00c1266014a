/**
 * The README's option tables are generated from the option table (src/options/docs.ts), so they
 * cannot drift: this test fails when one is stale, and `npm run docs` rewrites them.
 */
import { readFileSync, writeFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { commandNames, entriesFor, flagOf, optionTableMarkdown, updateOptionDocs } from "../../src/options/index.js";

const readmeUrl = new URL("../../README.md", import.meta.url);

describe("the README's option tables", () => {
  it("are the ones the option table generates (npm run docs rewrites them)", () => {
    const readme = readFileSync(readmeUrl, "utf8");
    const current = updateOptionDocs(readme);
    if (process.env.BETABOUND_WRITE_DOCS === "1" && current !== readme) writeFileSync(readmeUrl, current);
    expect(readFileSync(readmeUrl, "utf8")).toBe(current);
  });

  it("document every option of every command", () => {
    const readme = readFileSync(readmeUrl, "utf8");
    for (const command of commandNames) {
      // Each option's row in its command's table (roll shares its books and reading options with solve's table).
      const shared = command === "roll" ? ["books", "reading"] : [];
      for (const entry of entriesFor(command, { withFlagOnly: true })) {
        const table = optionTableMarkdown(shared.includes(entry.group) ? "solve" : command, [entry.group]);
        const flag = entry.negated === true ? `--no-${flagOf(entry.name).slice(2)}` : flagOf(entry.name);
        const row = table.split("\n").find((line) => line.startsWith(`| \`${flag}\``) || line.startsWith(`| \`${flag} `));
        expect(row, `${command} ${entry.name}`).toBeDefined();
        expect(readme, `${command} ${entry.name}`).toContain(row);
      }
    }
  });

  it("refuses a block that names an unknown command or group", () => {
    expect(() => updateOptionDocs("<!-- options: solve bookz -->\n<!-- end options -->")).toThrow(/unknown command or group/);
    expect(() => updateOptionDocs("<!-- options: solv -->\n<!-- end options -->")).toThrow(/unknown command or group/);
  });

  it("show each option's flag, config key, meaning with its choices, and default", () => {
    const table = optionTableMarkdown("solve", ["model", "uncertainty"]);
    expect(table).toContain("| `--weight <w>` | `weight` | weight of the low book in the market proxy, 0.0001 <= w <= 0.9999 | 0.5 |");
    expect(table).toContain("| `--no-uncertainty` | `uncertainty` |");
    expect(table).toContain("(hac, iid) | hac |");
    expect(table).not.toContain("--window");
  });
});
