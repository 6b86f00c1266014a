/**
 * Text report sections of the extensions (docs/methods.md §2, §3): the model with an independent index
 * and the sensitivity of the set to correlated noise. Each returns its lines; none when not asked for.
 */

import { indexParameterNames, type IndexParameter } from "../../core/models/indexModel.js";
import type { SensitivityKind } from "../../core/models/correlatedNoise.js";
import { formatNumber, notAvailable } from "../format.js";
import { fields, indent, printable, table, wrap, type Style } from "../layout.js";
import type { IndexReport, SensitivityReport, SolveReport } from "../types.js";
import { diagnosticLines } from "./textDiagnostics.js";
import { factorModelSection } from "./textFactorModel.js";

const parameterLabels: Record<IndexParameter, string> = {
  lowBeta: "low structural beta",
  highBeta: "high structural beta",
  indexLoading: "index loading",
  factorVariance: "factor variance",
  lowNoiseVariance: "low noise variance",
  highNoiseVariance: "high noise variance",
  indexNoiseVariance: "index noise variance",
};

const yesNo = (x: boolean | null, yes: string, no: string): string => (x === null ? notAvailable : x ? yes : no);

/** The sections of the extensions that the report holds. */
export function modelSections(
  report: Pick<SolveReport, "index" | "sensitivity"> & Partial<Pick<SolveReport, "factorModel">>,
  style: Style,
): string[][] {
  const sections: string[][] = [];
  if (report.index !== null) sections.push(indexSection(report.index, style));
  if (report.sensitivity !== null) sections.push(sensitivitySection(report.sensitivity, style));
  if (report.factorModel != null) sections.push(factorModelSection(report.factorModel, style));
  return sections;
}

/** The model with an index: estimates with their standard errors, and whether they are admissible. */
export function indexSection(index: IndexReport, style: Style): string[] {
  const heading = style.heading(`Model with an independent index (column "${printable(index.column)}")`);
  const intro =
    "With a third indicator of the factor the structural betas are point identified. " +
    "It assumes the index's noise is uncorrelated with both books' noises.";
  const withBootstrap = index.bootstrapStdErrors !== null;
  const header = ["", "estimate", "std. error", ...(withBootstrap ? ["bootstrap\nstd. error"] : [])];
  const rows = indexParameterNames.map((name) => [
    parameterLabels[name],
    formatNumber(index[name]),
    formatNumber(index.stdErrors?.[name] ?? null),
    ...(withBootstrap ? [formatNumber(index.bootstrapStdErrors?.[name] ?? null)] : []),
  ]);
  const identified = index.lowBeta !== null;
  return [
    heading,
    ...wrap(intro, indent, indent),
    ...(identified ? table({ header, rows }) : [`${indent}Not estimated:`]),
    ...(identified
      ? fields([
          [
            "sign condition",
            yesNo(index.signCondition, "holds (the three covariances' product is positive)", "fails: no one-factor structure fits"),
          ],
          ["admissible", yesNo(index.admissible, "yes", "no (negative noise variances are shown as computed)")],
          ["in the two-book set", yesNo(index.insideSet, "yes", "no: the index and the books disagree on the structure")],
        ])
      : []),
    ...diagnosticLines(index.diagnostics, style),
  ];
}

const kindWords: Record<SensitivityKind, string> = {
  unchanged: "same as uncorrelated",
  wider: "wider",
  "not-an-interval": "not an interval",
  "no-set": "no set",
};

/** The sensitivity table: the set of both betas under each assumed noise correlation. */
export function sensitivitySection(entries: SensitivityReport, style: Style): string[] {
  const rows = entries.map((e) => [
    String(e.noiseCorrelation),
    formatNumber(e.bounds.lowBeta.min),
    formatNumber(e.bounds.lowBeta.max),
    formatNumber(e.bounds.highBeta.min),
    formatNumber(e.bounds.highBeta.max),
    kindWords[e.kind],
  ]);
  const note =
    "The identified set when the books' noises are correlated (rho): negative rho leaves the bounds as they are, " +
    "positive rho below the books' observed correlation widens them, and from that correlation on the structures " +
    "that fit no longer form an interval.";
  return [
    style.heading("Sensitivity to correlated noise"),
    ...table({
      header: ["noise\ncorrelation", "low beta\nfrom", "\nto", "high beta\nfrom", "\nto", "set"],
      rows,
    }),
    "",
    ...wrap(note, indent, indent),
    ...diagnosticLines(
      entries.flatMap((e) => e.diagnostics),
      style,
    ),
  ];
}
