/** The JSON of the extensions of solve (src/schema/models.ts): fields copied in a fixed order. */
import { indexParameterNames } from "../core/models/indexModel.js";
import type { IndexValues } from "../core/models/indexSolve.js";
import type { SolveOutputJson } from "../schema/solveOutput.js";
import type { IndexReport, SensitivityReport } from "./types.js";

const values = (v: IndexValues) => Object.fromEntries(indexParameterNames.map((name) => [name, v[name]])) as IndexValues;

export function indexOutput(index: IndexReport | null): SolveOutputJson["index"] {
  if (index === null) return null;
  return {
    column: index.column,
    ...values(index),
    signCondition: index.signCondition,
    admissible: index.admissible,
    insideSet: index.insideSet,
    stdErrors: index.stdErrors === null ? null : values(index.stdErrors),
    bootstrapStdErrors: index.bootstrapStdErrors === null ? null : values(index.bootstrapStdErrors),
    diagnostics: index.diagnostics,
  };
}

export function sensitivityOutput(sensitivity: SensitivityReport | null): SolveOutputJson["sensitivity"] {
  if (sensitivity === null) return null;
  return sensitivity.map((entry) => ({
    noiseCorrelation: entry.noiseCorrelation,
    kind: entry.kind,
    bounds: {
      lowBeta: { min: entry.bounds.lowBeta.min, max: entry.bounds.lowBeta.max },
      highBeta: { min: entry.bounds.highBeta.min, max: entry.bounds.highBeta.max },
    },
    diagnostics: entry.diagnostics,
  }));
}
