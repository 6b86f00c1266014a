/**
 * The README's option tables are generated from the option table (src/options/docs.ts), so they
 * cannot drift: this test fails when one is stale, and `npm run docs` rewrites them.
 */
import { readFileSync, writeFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { optionTableMarkdown, updateOptionDocs } from "../../src/options/index.js";

const readmeUrl = new URL("../../README.md", import.meta.url);

describe("the README's option tables", () => {
  it("are the ones the option table generates (npm run docs rewrites them)", () => {
    const readme = readFileSync(readmeUrl, "utf8");
    const current = updateOptionDocs(readme);
    if (process.env.BETABOUND_WRITE_DOCS === "1" && current !== readme) writeFileSync(readmeUrl, current);
    else expect(readme).toBe(current);
  });

  it("document every option of every command, each once", () => {
    const readme = readFileSync(readmeUrl, "utf8");
    for (const line of optionTableMarkdown("solve").split("\n").slice(2)) expect(readme).toContain(line);
    expect(readme.match(/<!-- options: /g)?.length).toBeGreaterThanOrEqual(5);
  });

  it("show each option's flag, config key, meaning with its choices, and default", () => {
    const table = optionTableMarkdown("solve", ["model", "uncertainty"]);
    expect(table).toContain("| `--weight <w>` | `weight` | weight of the low book in the market proxy, 0 < w < 1 | 0.5 |");
    expect(table).toContain("| `--no-uncertainty` | `uncertainty` |");
    expect(table).toContain("(hac, iid) | hac |");
    expect(table).not.toContain("--window");
  });
});
