/**
 * The report as one self-contained HTML file: the text report's content as HTML tables, with the
 * identified-set chart inline. No scripts, no external style sheets, fonts or images, so it opens
 * offline and prints cleanly (print CSS: A4, no page breaks inside a table row or the chart).
 *
 * Every string that comes from the data (file name, column names, dates, diagnostics) is escaped.
 * The charts are SVG documents made by this package's renderers and are inlined as they are, minus
 * their XML namespace declarations (HTML does not need them).
 */

import type { Solution } from "../../core/types.js";
import type { Section } from "../blocks.js";
import { landmarkNames } from "../../core/types.js";
import { largestCapmDiscrepancy } from "../check.js";
import { excessReturnBasis, modelAssumptions } from "../conventions.js";
import { type ReportDiagnostic, reportDiagnostics } from "../diagnosticList.js";
import { formatCount, formatNumber, notAvailable } from "../format.js";
import { titleLine } from "../text/text.js";
import { cautionLine } from "../text/textNotes.js";
import { capm, moments, numbersText, returnsWord, riskFreeText, rowsText, tableText } from "../text/textData.js";
import { pricing } from "../text/textPricing.js";
import { modelSectionsOf } from "../text/textModels.js";
import { summary } from "../text/textSummary.js";
import { bootstrap, boundsWithUncertainty, precision, sharpe } from "../text/textUncertainty.js";
import { sectionHtml } from "./htmlBlocks.js";
import { landmarkWords } from "../conventions.js";
import { candidateColumns, landmarkDescriptions, landmarkNote, reproductionTolerance } from "../text/textSet.js";
import type { InputDescription, RiskFreeSource, SolveReport } from "../types.js";
import { escapeHtml, fields, inlineSvg, paragraph, section, table } from "./htmlElements.js";
import { css } from "./htmlStyle.js";

export { escapeHtml };

export interface HtmlReportCharts {
  /** The identified-set chart (SVG from renderIdentifiedSetChart). */
  readonly identifiedSet: string;
  /** Optionally, a rolling-window chart (SVG from renderRollChart). */
  readonly roll?: string;
  /** Optionally, the k-portfolio factor model's chart (SVG from renderFactorChart). */
  readonly factor?: string;
}

export interface HtmlReportOptions {
  /** The document title (the browser tab); by default the tool, the two columns and the file. */
  readonly title?: string;
}

/** Renders the HTML document (LF line endings, trailing newline). */
export function renderHtmlReport(report: SolveReport, charts: HtmlReportCharts, options: HtmlReportOptions = {}): string {
  const s = report.solution;
  const input = report.input;
  const title = options.title ?? `${report.tool.name}: "${input.lowColumn}" and "${input.highColumn}" (${input.source})`;
  const u = report.uncertainty;
  const perYear = input.frequency?.periodsPerYear ?? null;
  const shared = (x: Section | null): string[] => (x === null ? [] : [sectionHtml(x)]);
  const sections: string[] = [
    sectionHtml(summary(report)),
    chartSection(charts),
    inputSection(input, s.observations),
    sectionHtml(moments(s, perYear, `Sample moments (${returnsWord(input.riskFree)}, per period)`)),
    sectionHtml(capm(s, u, perYear)),
  ];
  if (s.bounds === null) {
    const reason = s.diagnostics.find((d) => d.severity === "error")?.message ?? null;
    sections.push(
      section(
        "set",
        "The identified set",
        paragraph(
          "None: no one-factor structure fits these data, so no set, landmarks or candidates are shown." +
            (reason === null ? "" : ` Why: ${reason}.`),
        ),
      ),
    );
    if (u !== null) sections.push(sectionHtml(precision(s, u)));
  } else {
    sections.push(boundsSection(s));
    if (u !== null) sections.push(...shared(boundsWithUncertainty(s.bounds, u)), sectionHtml(precision(s, u)));
    if (s.landmarks !== null) sections.push(landmarksSection(s, perYear));
    sections.push(...shared(report.pricing === null ? null : pricing(report.pricing)), gridSection(s, perYear));
  }
  sections.push(...modelSectionsOf(report).map(sectionHtml));
  if (u !== null) sections.push(sectionHtml(sharpe(u, perYear, input.riskFree.kind !== "none")), ...shared(bootstrap(u)));
  sections.push(diagnosticsSection(reportDiagnostics(report)), assumptionsSection(s.weight), closingSection(input.riskFree));
  return [
    "<!DOCTYPE html>",
    '<html lang="en">',
    "<head>",
    '<meta charset="utf-8">',
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<meta name="generator" content="${escapeHtml(`${report.tool.name} ${report.tool.version}`)}">`,
    `<title>${escapeHtml(title)}</title>`,
    `<style>\n${css}</style>`,
    "</head>",
    "<body>",
    "<header>",
    `<h1>${escapeHtml(titleLine(report))}</h1>`,
    `<p class="lede">Statistical estimates from ${escapeHtml(input.source)}, ${escapeHtml(input.firstDate)} to ` +
      `${escapeHtml(input.lastDate)} (${formatCount(s.observations)} observations), under the assumptions listed below; not investment advice.</p>`,
    "</header>",
    "<main>",
    ...sections,
    "</main>",
    "</body>",
    "</html>",
    "",
  ].join("\n");
}

function chartSection(charts: HtmlReportCharts): string {
  const figures = [
    "<figure>",
    inlineSvg(charts.identifiedSet),
    "<figcaption>The shaded range holds every low structural beta consistent with the sample moments; " +
      "the lines show what each value implies for the noise of the two books, and the symbols mark the landmarks " +
      "listed below.</figcaption>",
    "</figure>",
  ];
  if (charts.roll !== undefined) {
    figures.push(
      "<figure>",
      inlineSvg(charts.roll),
      "<figcaption>The identified set and the CAPM beta of the low book in rolling windows.</figcaption>",
      "</figure>",
    );
  }
  if (charts.factor !== undefined) {
    figures.push(
      "<figure>",
      inlineSvg(charts.factor),
      "<figcaption>Each portfolio's structural loading in the one-factor model against its CAPM beta on the same " +
        "market proxy, with the loadings' intervals; on the dashed line the two are equal.</figcaption>",
      "</figure>",
    );
  }
  return section("chart", "The identified set at a glance", ...figures);
}

function inputSection(input: InputDescription, observations: number): string {
  const frequency =
    input.frequency === null
      ? "could not be told from the dates"
      : `${input.frequency.name} (${input.frequency.periodsPerYear} periods per year)`;
  const units = input.units === "percent" ? "percent (divided by 100: every figure below is decimal)" : "decimal";
  const dropped =
    input.rowsDropped === 0
      ? "none"
      : `${input.rowsDropped} with a missing value${input.droppedDates.length > 0 ? `: ${input.droppedDates.join(", ")}` : ""}`;
  return section(
    "input",
    "Input",
    fields([
      ["File", input.source],
      ["Low book", `column "${input.lowColumn}"`],
      ["High book", `column "${input.highColumn}"`],
      ["Dates", `column "${input.dateColumn}", ${input.firstDate} to ${input.lastDate}`],
      // The text report's wording; its printable() of a column name is what escapeHtml does first anyway.
      ["Risk-free", riskFreeText(input.riskFree)],
      ["Table read", tableText(input)],
      ["Numbers", numbersText[input.inputKind]],
      ["Units in file", units],
      ["Observations", `${formatCount(observations)} used of ${formatCount(input.rowsRead)} rows read${rowsText(input)}`],
      ["Frequency", frequency],
      ["Dropped rows", dropped],
    ]),
  );
}

function boundsSection(s: Solution): string {
  const b = s.bounds!;
  const range = (i: { readonly min: number; readonly max: number }): [string, string] => [formatNumber(i.min), formatNumber(i.max)];
  return section(
    "set",
    "The identified set",
    table(
      ["", "from", "to"],
      [
        ["low structural beta", ...range(b.lowBeta)],
        ["high structural beta", ...range(b.highBeta)],
        ["factor variance", ...range(b.factorVariance)],
      ],
    ),
    paragraph(
      "Every pair of betas in this range fits the data equally well: the pairs differ only in how each book's risk " +
        "splits between the common factor and its own noise.",
    ),
  );
}

/** The text report's candidate columns, each heading on one line. */
function candidates(periodsPerYear: number | null) {
  const columns = candidateColumns(periodsPerYear);
  return { ...columns, header: columns.header.map((h) => h.replace(/\n/g, " ")) };
}

function landmarksSection(s: Solution, periodsPerYear: number | null): string {
  const landmarks = s.landmarks!;
  const columns = candidates(periodsPerYear);
  const rows = landmarkNames.map((name) => {
    const c = landmarks[name];
    const note = landmarkNote(c);
    const cells = c === null ? columns.header.map(() => notAvailable) : columns.cells(c);
    return [landmarkWords[name], `${landmarkDescriptions[name]}${note}`, ...cells];
  });
  return section(
    "landmarks",
    "Landmarks",
    table(["", "meaning", ...columns.header], rows, { textColumns: [1] }),
    paragraph(columns.note, "note"),
  );
}

function gridSection(s: Solution, periodsPerYear: number | null): string {
  const columns = candidates(periodsPerYear);
  const rows = s.grid.map((c, i) => [String(i + 1), ...columns.cells(c)]);
  const discrepancy = largestCapmDiscrepancy(s);
  const check =
    discrepancy === null
      ? ""
      : discrepancy <= reproductionTolerance
        ? paragraph(
            `Check: every candidate reproduces the observed CAPM betas and residual variances (largest relative difference across the grid: ${formatNumber(discrepancy, 2)}).`,
            "note",
          )
        : paragraph(
            `Check FAILED: the candidates do not reproduce the observed CAPM betas and residual variances (largest relative difference across the grid: ${formatNumber(discrepancy, 2)}).`,
            "warning",
          );
  return section(
    "grid",
    "Candidate grid",
    paragraph(`${s.grid.length} structures with the low beta evenly spaced over the set, ends included.`, "note"),
    table(["#", ...columns.header], rows),
    paragraph(columns.note, "note"),
    check,
  );
}

function diagnosticsSection(diagnostics: readonly ReportDiagnostic[]): string {
  if (diagnostics.length === 0) return section("diagnostics", "Diagnostics", paragraph("none"));
  const rows = diagnostics.map(
    (d) =>
      `<tr><th scope="row" class="${d.severity === "info" ? "" : d.severity}">${escapeHtml(d.severity)}</th><td class="text">${escapeHtml(d.message)}</td></tr>`,
  );
  return section(
    "diagnostics",
    "Diagnostics",
    `<table>\n<thead><tr><th scope="col">severity</th><th scope="col">message</th></tr></thead>\n<tbody>\n${rows.join("\n")}\n</tbody></table>`,
  );
}

function assumptionsSection(weight: number): string {
  const items = modelAssumptions.map((a) => a.replace("M = w low + (1 - w) high", `M = w low + (1 - w) high (w = ${weight})`));
  return section("assumptions", "Assumptions", `<ul>\n${items.map((a) => `<li>${escapeHtml(a)}</li>`).join("\n")}\n</ul>`);
}

function closingSection(riskFree: RiskFreeSource): string {
  const basis =
    riskFree.kind === "none" ? "returns are raw (no risk-free rate was given)" : `returns are in excess of ${excessReturnBasis(riskFree)}`;
  return [
    '<footer class="caution">',
    `<p><strong>${escapeHtml(cautionLine)}</strong></p>`,
    paragraph(
      `Conventions: decimal units per period (0.01 is one percent); variances and covariances use the divisor n - 1; ${basis}.`,
      "note",
    ),
    "</footer>",
  ].join("\n");
}
