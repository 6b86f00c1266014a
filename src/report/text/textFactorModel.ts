/** The text report's section of the one-factor model on k portfolios (docs/methods.md §31). */
import type { FactorModel } from "../../core/models/factorModel.js";
import { formatNumber, notAvailable } from "../format.js";
import type { Block, Section } from "../blocks.js";
import { printable } from "../layout.js";

/** The section, said once as data for the text and HTML reports (report/blocks.ts). */
export function factorModelSection(model: FactorModel): Section {
  const rows = model.portfolios.map((p) => [
    printable(p.name),
    formatNumber(p.weight),
    formatNumber(p.loading),
    formatNumber(p.loadingStdError),
    formatNumber(p.capmBeta),
    formatNumber(p.noiseVariance),
  ]);
  const fit = model.fit;
  const fitText =
    fit === null
      ? notAvailable
      : fit.degreesOfFreedom === 0
        ? "exact (three portfolios: no degrees of freedom left to test one factor)"
        : `chi-square ${formatNumber(fit.statistic)} on ${fit.degreesOfFreedom} df, p = ${formatNumber(fit.pValue)}`;
  const pairRows = model.adjacentPairs.map((pair) => [
    `${printable(pair.low)} / ${printable(pair.high)}`,
    formatNumber(pair.bounds?.lowBeta.min ?? null),
    formatNumber(pair.bounds?.lowBeta.max ?? null),
    formatNumber(pair.factorLowBeta),
    pair.insideSet === null ? notAvailable : pair.insideSet ? "yes" : "no",
  ]);
  const intro =
    `One factor fitted by maximum likelihood to ${model.portfolios.length} portfolios (${model.observations} rows); ` +
    "loadings scaled so that the market proxy (their weighted sum) has beta 1. The CAPM beta on that proxy differs from " +
    "the loading through each portfolio's own noise, which the proxy contains.";
  const seen = new Set<string>();
  const diagnostics: Block[] = model.diagnostics
    .filter((d) => !seen.has(d.message) && seen.add(d.message))
    .map((d) => ({
      kind: "paragraph",
      text: `${d.severity}: ${printable(d.message)}`,
      ...(d.severity === "info" ? {} : { tone: "warning" as const }),
    }));
  return {
    id: "factor-model",
    heading: "One-factor model on the portfolios",
    blocks: [
      { kind: "paragraph", text: intro },
      { kind: "table", header: ["portfolio", "weight", "loading", "std. error", "CAPM beta", "noise\nvariance"], rows },
      { kind: "gap" },
      {
        kind: "fields",
        pairs: [
          ["factor variance", formatNumber(model.factorVariance)],
          ["fit of one factor", fitText],
          ["Heywood cases", model.heywood.length === 0 ? "none" : model.heywood.map(printable).join(", ")],
        ],
      },
      ...(pairRows.length === 0
        ? []
        : ([
            { kind: "gap" },
            {
              kind: "paragraph",
              text: "Each adjacent pair's two-book set with its own market proxy, beside the factor model's beta in that normalisation:",
            },
            { kind: "table", header: ["pair", "low beta\nfrom", "\nto", "factor\nmodel", "inside"], rows: pairRows },
          ] satisfies Block[])),
      ...diagnostics,
    ],
  };
}
