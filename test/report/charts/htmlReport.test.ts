import { Parser } from "htmlparser2";
import { describe, expect, test } from "vitest";
import { landmarkNames } from "../../../src/core/types.js";
import { landmarkWords, modelAssumptions } from "../../../src/report/conventions.js";
import { renderIdentifiedSetChart } from "../../../src/report/charts/identifiedSetChart.js";
import { renderHtmlReport } from "../../../src/report/charts/htmlReport.js";
import { factorChartTitle } from "../../../src/report/charts/factorChart.js";
import { formatNumber } from "../../../src/report/format.js";
import { cautionLine } from "../../../src/report/text/textNotes.js";
import { landmarkDescriptions } from "../../../src/report/text/textSet.js";
import type { SolveReport } from "../../../src/report/types.js";
import { readFileSync } from "node:fs";
import { run } from "../../../src/cli/program.js";
import { pricingSentence } from "../../../src/report/text/textPricing.js";
import { fakeIo } from "../../cli/fakeIo.js";
import { rejectedSolution, reportOf, typicalSolution } from "../fixtures.js";

interface Node {
  readonly name: string;
  readonly attribs: Record<string, string>;
  readonly children: (Node | string)[];
}

/** Parses HTML into a tree with htmlparser2, failing on any parser error or unclosed element. */
function parseHtml(html: string): { root: Node; doctype: string | null } {
  const root: Node = { name: "#document", attribs: {}, children: [] };
  const stack: Node[] = [root];
  let doctype: string | null = null;
  const errors: string[] = [];
  const selfClosing: boolean[] = [];
  const parser: Parser = new Parser(
    {
      onprocessinginstruction: (name, data) => {
        if (name.toLowerCase() === "!doctype") doctype = data;
      },
      onopentag: (name, attribs) => {
        selfClosing.push(html.slice(parser.startIndex, parser.endIndex + 1).endsWith("/>"));
        const node: Node = { name, attribs, children: [] };
        stack[stack.length - 1]!.children.push(node);
        stack.push(node);
      },
      ontext: (text) => stack[stack.length - 1]!.children.push(text),
      onclosetag: (name, implied) => {
        const top = stack.pop();
        const wasSelfClosing = selfClosing.pop() ?? false;
        if (top?.name !== name) errors.push(`</${name}> closes <${top?.name}>`);
        if (implied && !wasSelfClosing && !voidElements.has(name)) errors.push(`<${name}> was not closed`);
      },
      onerror: (error) => errors.push(error.message),
    },
    { decodeEntities: true, recognizeSelfClosing: true },
  );
  parser.write(html);
  parser.end();
  expect(errors).toEqual([]);
  expect(stack).toHaveLength(1);
  return { root, doctype };
}

const voidElements = new Set(["meta", "br", "hr", "img", "input", "link", "area", "base", "col", "embed", "source", "track", "wbr"]);

function all(node: Node, name: string): Node[] {
  return node.children.flatMap((c) => (typeof c === "string" ? [] : [...(c.name === name ? [c] : []), ...all(c, name)]));
}

function textOf(node: Node | string): string {
  return typeof node === "string" ? node : node.children.map(textOf).join("");
}

function sectionById(root: Node, id: string): Node {
  const found = all(root, "section").filter((s) => s.attribs.id === id);
  expect(found, `section #${id}`).toHaveLength(1);
  return found[0]!;
}

/** The rows of a table as arrays of cell texts (th and td), header row included. */
function rows(table: Node): string[][] {
  return all(table, "tr").map((tr) => tr.children.filter((c): c is Node => typeof c !== "string").map((c) => textOf(c).trim()));
}

async function htmlFor(report: SolveReport): Promise<string> {
  return renderHtmlReport(report, { identifiedSet: await renderIdentifiedSetChart(report, { y: "variance" }) });
}

describe("renderHtmlReport", () => {
  test("is one well-formed HTML document with the chart inline as SVG", async () => {
    const html = await htmlFor(reportOf(typicalSolution()));
    const { root, doctype } = parseHtml(html);
    expect(doctype).toMatch(/^!doctype html$/i);
    const [htmlElement] = all(root, "html");
    expect(htmlElement?.attribs.lang).toBe("en");
    expect(all(root, "meta").some((m) => m.attribs.charset === "utf-8")).toBe(true);
    expect(all(root, "svg")).toHaveLength(1);
    expect(all(sectionById(root, "chart"), "svg")).toHaveLength(1);
    expect(textOf(all(root, "h1")[0]!)).toMatch(/^betabound 0\.1\.0-test: /);
  });

  test("is self-contained: no scripts, no external style sheets, fonts or images, no http(s) references", async () => {
    const html = await htmlFor(reportOf(typicalSolution()));
    const { root } = parseHtml(html);
    expect(html).not.toMatch(/https?:\/\//i);
    expect(html).not.toMatch(/@import|url\(|@font-face/i);
    for (const tag of ["script", "link", "img", "iframe", "object", "embed"]) expect(all(root, tag), tag).toHaveLength(0);
    expect(html).not.toMatch(/\s(src|href|xlink:href)=/i);
    expect(all(root, "style")).toHaveLength(1);
  });

  test("has print rules: an A4 page, no breaks inside the chart or a table row, repeated table headers", async () => {
    const html = await htmlFor(reportOf(typicalSolution()));
    const css = textOf(all(parseHtml(html).root, "style")[0]!);
    expect(css).toMatch(/@page\s*\{\s*size:\s*A4/);
    expect(css).toMatch(/@media print\s*\{/);
    expect(css).toMatch(/figure, tr, \.caution \{ break-inside: avoid/);
    expect(css).toMatch(/thead \{ display: table-header-group; \}/);
  });

  test("gives every section of the text report as a table or list, with the solution's values", async () => {
    const solution = typicalSolution();
    const report = reportOf(solution);
    const { root } = parseHtml(await htmlFor(report));
    const input = rows(all(sectionById(root, "input"), "table")[0]!);
    expect(input).toContainEqual(["File", report.input.source]);
    expect(input).toContainEqual(["Low book", `column "${report.input.lowColumn}"`]);
    const moments = rows(all(sectionById(root, "moments"), "table")[0]!);
    expect(moments[1]!.slice(0, 5)).toEqual([
      "low",
      ...[solution.moments.low.mean, solution.moments.low.stdev, solution.moments.low.variance, solution.moments.low.sharpeRatio].map((x) =>
        formatNumber(x),
      ),
    ]);
    // Monthly: the mean times 12 and the volatility, the stdev times sqrt(12), in % a year.
    expect(moments[1]!.slice(5)).toEqual([
      formatNumber(1200 * solution.moments.low.mean, 3),
      formatNumber(100 * Math.sqrt(12) * solution.moments.low.stdev!, 3),
    ]);
    const capm = rows(all(sectionById(root, "capm"), "table")[0]!);
    expect(capm).toContainEqual(["beta", formatNumber(solution.capm.low.beta), formatNumber(solution.capm.high.beta)]);
    const set = rows(all(sectionById(root, "set"), "table")[0]!);
    expect(set).toContainEqual([
      "low structural beta",
      formatNumber(solution.bounds!.lowBeta.min),
      formatNumber(solution.bounds!.lowBeta.max),
    ]);
    const landmarks = rows(all(sectionById(root, "landmarks"), "table")[0]!);
    expect(landmarks.slice(1).map((r) => r[0])).toEqual(landmarkNames.map((name) => landmarkWords[name]));
    for (const [i, name] of landmarkNames.entries()) expect(landmarks[i + 1]![1]).toContain(landmarkDescriptions[name]);
    expect(landmarks.find((r) => r[0] === landmarkWords.returnImplied)![1]).toContain(
      "(outside the identified set by the point estimates; the pricing section tests whether significantly)",
    );
    const grid = rows(all(sectionById(root, "grid"), "table")[0]!);
    expect(grid).toHaveLength(solution.grid.length + 1);
    expect(textOf(sectionById(root, "grid"))).toContain("Check: every candidate reproduces the observed CAPM betas");
    const diagnostics = rows(all(sectionById(root, "diagnostics"), "table")[0]!);
    expect(diagnostics.slice(1).map((r) => r[1])).toEqual(solution.diagnostics.map((d) => d.message));
    const assumptions = all(sectionById(root, "assumptions"), "li").map((li) => textOf(li));
    expect(assumptions).toHaveLength(modelAssumptions.length);
    expect(assumptions[3]).toContain("(w = 0.5)");
    expect(textOf(all(root, "footer")[0]!)).toContain(cautionLine);
  });

  test("escapes every text taken from the data: a column name with <script> in it stays text", async () => {
    const lowColumn = '<script>alert("low")</script>';
    const highColumn = "High & <b>Beta</b> \u001b[31m";
    const source = "dir/<img src=x onerror=alert(1)>.csv";
    const report = reportOf(typicalSolution(), { lowColumn, highColumn, source, dateColumn: "Date' onload='x" });
    const html = await htmlFor(report);
    const { root } = parseHtml(html);
    expect(all(root, "script")).toHaveLength(0);
    expect(all(root, "img")).toHaveLength(0);
    expect(all(root, "b")).toHaveLength(0);
    expect(html).not.toContain("\u001b");
    const input = rows(all(sectionById(root, "input"), "table")[0]!);
    expect(input).toContainEqual(["Low book", `column "${lowColumn}"`]);
    expect(input).toContainEqual(["High book", 'column "High & <b>Beta</b> \\u{1b}[31m"']);
    expect(input).toContainEqual(["File", source]);
    expect(textOf(all(root, "title")[0]!)).toContain(lowColumn);
  });

  test("says there is no identified set, and shows no landmark or grid tables, when the model is rejected", async () => {
    const report = reportOf(rejectedSolution());
    const { root } = parseHtml(await htmlFor(report));
    expect(textOf(sectionById(root, "set"))).toContain("None: no one-factor structure fits these data");
    expect(all(root, "section").map((s) => s.attribs.id)).not.toContain("landmarks");
    expect(all(root, "section").map((s) => s.attribs.id)).not.toContain("grid");
    expect(textOf(sectionById(root, "diagnostics"))).toContain("error");
  });

  test("refuses a chart that is not an SVG document", () => {
    expect(() => renderHtmlReport(reportOf(typicalSolution()), { identifiedSet: "<p>not a chart</p>" })).toThrow(RangeError);
  });
});

describe("the HTML report of a full run holds what the text report holds", () => {
  const monthly = readFileSync(new URL("../../../examples/harbourline-monthly.csv", import.meta.url), "utf8");
  const low = '<b>Low</b> & "calm"';
  const high = "High<script>x</script>";
  const csv = monthly.replace(/^[^\n]*/, `Month End,"${low.replace(/"/g, '""')}",${high}`);

  async function both() {
    const args = ["solve", "m.csv", "--low", low, "--high", high, "--rf", "0.002", "--bootstrap", "40", "--threads", "1"];
    const { io, stdout, written } = fakeIo({ "m.csv": csv });
    expect(await run([...args, "--report", "r.html"], io)).toBe(0);
    const json = fakeIo({ "m.csv": csv });
    expect(await run([...args, "--format", "json"], json.io)).toBe(0);
    return { text: stdout(), html: written.get("r.html")!, json: JSON.parse(json.stdout()) };
  }

  test("every heading of the text report is a section heading of the HTML report, and names stay text", async () => {
    const { text, html } = await both();
    const { root } = parseHtml(html);
    const headings = all(root, "h2").map((h) => textOf(h));
    const lines = text.split("\n");
    const textHeadings = lines.filter(
      (line, i) => i > 0 && /^[A-Z]/.test(line) && lines[i - 1] === "" && !/^(Caution|Conventions)/.test(line),
    );
    expect(textHeadings.length).toBeGreaterThan(10);
    for (const heading of textHeadings) expect(headings, heading).toContain(heading);
    expect(html).not.toContain("<script>x");
    expect(html).not.toContain("<b>Low");
    expect(textOf(sectionById(root, "input"))).toContain(`column "${low}"`);
  });

  test("the summary, CAPM HAC errors, beta intervals, Sharpe ratios, bootstrap and pricing carry the run's figures", async () => {
    const { html, json } = await both();
    const { root } = parseHtml(html);
    const summary = rows(all(sectionById(root, "summary"), "table")[0]!);
    expect(summary.map((r) => r[0])).toEqual([
      "Sample",
      "Low structural beta",
      "Low book CAPM beta",
      "Low book CAPM alpha",
      "Noise explains it?",
      "Diagnostics",
    ]);
    expect(summary[4]![1]).toBe(pricingSentence(json.pricing));
    const capm = rows(all(sectionById(root, "capm"), "table")[0]!);
    expect(capm).toContainEqual([
      "alpha HAC std. error",
      formatNumber(json.capm.low.hac.alphaStdErr),
      formatNumber(json.capm.high.hac.alphaStdErr),
    ]);
    expect(textOf(sectionById(root, "capm"))).toContain("w alpha_low + (1 - w) alpha_high = 0");
    const precision = rows(all(sectionById(root, "precision"), "table")[0]!);
    const b = json.uncertainty.bounds.lowBeta.min;
    expect(precision).toContainEqual([
      "low structural beta",
      "lower end",
      formatNumber(b.estimate),
      formatNumber(b.stdError),
      `${formatNumber(b.lower)} to ${formatNumber(b.upper)}`,
    ]);
    const interval = json.uncertainty.lowBeta.interval;
    expect(rows(all(sectionById(root, "precision"), "table")[1]!)[0]![1]).toBe(
      `${formatNumber(interval.lower)} to ${formatNumber(interval.upper)}`,
    );
    const sharpe = rows(all(sectionById(root, "sharpe"), "table")[0]!);
    expect(sharpe[1]!.slice(0, 5)).toEqual([
      "low",
      ...["estimate", "iidStdErr", "mertensStdErr", "hacStdErr"].map((k) => formatNumber(json.uncertainty.sharpe.low[k])),
    ]);
    const boot = rows(all(sectionById(root, "bootstrap"), "table")[0]!);
    expect(boot).toHaveLength(1 + Object.keys(json.uncertainty.bootstrap.stdErrors).length);
    const pricing = rows(all(sectionById(root, "pricing"), "table")[0]!);
    expect(pricing).toContainEqual([
      "CAPM alpha",
      formatNumber(json.pricing.alpha.low.observed),
      formatNumber(json.pricing.alpha.low.annualised.observed),
    ]);
    expect(all(sectionById(root, "reading"), "li").length).toBeGreaterThanOrEqual(4);
  });
});

describe("the k-portfolio chart in the HTML report and the chart file", () => {
  const dataset = readFileSync(new URL("../../fixtures/factor-model/factor_dataset.csv", import.meta.url), "utf8");
  const args = ["solve", "f.csv", "--low", "P1", "--high", "P5", "--portfolios", "P1,P2,P3,P4,P5", "--no-uncertainty"];

  test("--chart draws the loadings against the CAPM betas; --report holds that chart and the identified set's", async () => {
    const { io, written } = fakeIo({ "f.csv": dataset });
    expect(await run([...args, "--chart", "c.svg", "--report", "r.html", "--format", "json"], io)).toBe(0);
    const chart = written.get("c.svg")!;
    expect(chart).toContain(`<title>${factorChartTitle}</title>`);
    expect(chart).toContain(">P3</text>");
    const { root } = parseHtml(written.get("r.html")!);
    const figures = all(sectionById(root, "chart"), "figure");
    expect(figures).toHaveLength(2);
    expect(textOf(figures[1]!)).toContain(factorChartTitle);
    expect(textOf(figures[0]!)).toMatch(/identified set/i);
  });

  test("without --portfolios the chart file is the identified set's and the report has no factor chart", async () => {
    const { io, written } = fakeIo({ "f.csv": dataset });
    expect(await run([...args.slice(0, 6), "--chart", "c.svg", "--report", "r.html"], io)).toBe(0);
    expect(written.get("c.svg")).not.toContain(factorChartTitle);
    expect(written.get("r.html")).not.toContain(factorChartTitle);
  });
});
