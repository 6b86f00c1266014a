/**
 * Text report sections of the extensions (docs/methods.md §2, §3): the model with an independent index
 * and the sensitivity of the set to correlated noise. Each returns its lines; none when not asked for.
 */

import { factorModelSection } from "./textFactorModel.js";
import { indexParameterNames, type IndexParameter } from "../../core/models/indexModel.js";
import type { SensitivityKind } from "../../core/models/correlatedNoise.js";
import { formatNumber, notAvailable } from "../format.js";
import { type Block, type Section, sectionLines } from "../blocks.js";
import { printable, type Style } from "../layout.js";
import type { Diagnostic } from "../../core/diagnostics.js";
import type { IndexReport, SensitivityReport, SolveReport } from "../types.js";

/** A section's own diagnostics, each with its severity, under it (the report's Diagnostics are the two-book model's). */
function diagnosticBlocks(diagnostics: readonly Diagnostic[]): Block[] {
  const seen = new Set<string>();
  return diagnostics
    .filter((d) => !seen.has(d.message) && seen.add(d.message))
    .map((d) => ({
      kind: "paragraph",
      text: `${d.severity}: ${printable(d.message)}`,
      ...(d.severity === "info" ? {} : { tone: "warning" as const }),
    }));
}

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
export function modelSectionsOf(report: Pick<SolveReport, "index" | "sensitivity"> & Partial<Pick<SolveReport, "factorModel">>): Section[] {
  const sections: Section[] = [];
  if (report.index !== null) sections.push(indexModel(report.index));
  if (report.sensitivity !== null) sections.push(sensitivity(report.sensitivity));
  if (report.factorModel != null) sections.push(factorModelSection(report.factorModel));
  return sections;
}

/** Their text. */
export function modelSections(
  report: Pick<SolveReport, "index" | "sensitivity"> & Partial<Pick<SolveReport, "factorModel">>,
  style: Style,
): string[][] {
  return modelSectionsOf(report).map((section) => sectionLines(section, style));
}

export function indexSection(index: IndexReport, style: Style): string[] {
  return sectionLines(indexModel(index), style);
}

export function sensitivitySection(entries: SensitivityReport, style: Style): string[] {
  return sectionLines(sensitivity(entries), style);
}

/** The model with an index: estimates with their standard errors, and whether they are admissible. */
export function indexModel(index: IndexReport): Section {
  const heading = `Model with an independent index (column "${printable(index.column)}")`;
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
  const blocks: Block[] = [
    { kind: "paragraph", text: intro },
    identified ? { kind: "table", header, rows } : { kind: "paragraph", text: "Not estimated:" },
    ...(identified
      ? [
          {
            kind: "fields",
            pairs: [
              [
                "sign condition",
                yesNo(index.signCondition, "holds (the three covariances' product is positive)", "fails: no one-factor structure fits"),
              ],
              ["admissible", yesNo(index.admissible, "yes", "no (negative noise variances are shown as computed)")],
              ["in the two-book set", yesNo(index.insideSet, "yes", "no: the index and the books disagree on the structure")],
            ],
          } as const,
        ]
      : []),
    ...diagnosticBlocks(index.diagnostics),
  ];
  return { id: "index", heading, blocks };
}

const kindWords: Record<SensitivityKind, string> = {
  unchanged: "same as uncorrelated",
  wider: "wider",
  "not-an-interval": "not an interval",
  "no-set": "no set",
};

/** The sensitivity table: the set of both betas under each assumed noise correlation. */
export function sensitivity(entries: SensitivityReport): Section {
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
  return {
    id: "sensitivity",
    heading: "Sensitivity to correlated noise",
    blocks: [
      { kind: "table", header: ["noise\ncorrelation", "low beta\nfrom", "\nto", "high beta\nfrom", "\nto", "set"], rows },
      { kind: "gap" },
      { kind: "paragraph", text: note },
      ...diagnosticBlocks(entries.flatMap((e) => e.diagnostics)),
    ],
  };
}
