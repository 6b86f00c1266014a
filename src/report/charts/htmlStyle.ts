/** The HTML report's style sheet: screen and print (A4, no page break inside a table row or the chart). */
export const css = `:root { color-scheme: light; }
body { font-family: Helvetica, Arial, "Liberation Sans", "DejaVu Sans", sans-serif; color: #222; background: #fff;
  margin: 0 auto; max-width: 60rem; padding: 1.5rem; line-height: 1.45; }
h1 { font-size: 1.45rem; margin: 0 0 0.4rem; }
h2 { font-size: 1.15rem; margin: 2rem 0 0.5rem; border-bottom: 1px solid #ccc; padding-bottom: 0.2rem; }
p { margin: 0.4rem 0; }
.lede { color: #444; }
table { border-collapse: collapse; margin: 0.5rem 0; font-size: 0.9rem; }
th, td { padding: 0.2rem 0.6rem; border-bottom: 1px solid #e2e2e2; vertical-align: top; }
thead th { border-bottom: 2px solid #999; text-align: right; font-weight: bold; }
thead th:first-child, tbody th { text-align: left; }
tbody th { font-weight: normal; white-space: nowrap; }
td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td.text { text-align: left; }
table.fields th { color: #444; }
.note { color: #444; font-size: 0.9rem; }
.warning { color: #8a4b00; font-weight: bold; }
.error { color: #a40000; font-weight: bold; }
figure { margin: 0.5rem 0; }
figure svg { display: block; max-width: 100%; height: auto; }
figcaption { color: #444; font-size: 0.9rem; margin-top: 0.3rem; }
.caution { border: 1px solid #bbb; background: #f6f6f6; padding: 0.6rem 0.8rem; margin-top: 2rem; }
code { font-family: "DejaVu Sans Mono", Menlo, Consolas, monospace; font-size: 0.9em; }
@page { size: A4; margin: 14mm; }
@media print {
  body { max-width: none; padding: 0; font-size: 9.5pt; }
  h2 { break-after: avoid; page-break-after: avoid; }
  figure, tr, .caution { break-inside: avoid; page-break-inside: avoid; }
  thead { display: table-header-group; }
  table { font-size: 8.5pt; }
  .caution { background: none; }
}
`;
