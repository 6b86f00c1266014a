/** The extensions of the two-book model: an independent index and correlated noise (entries of the option table, table.ts). */
import { numberListKind, textKind } from "../kinds.js";
import { option } from "../spec.js";
import { parameters } from "../../core/parameters.js";

export const modelOptions = {
  index: option(textKind("a column name"), {
    name: "index",
    argument: "<column>",
    help: "column of an independent market index, a third indicator of the factor: the structural betas are then point identified (of the low file when joining; rows missing it are dropped)",
    group: "model",
    commands: ["solve"],
  }),
  noiseCorrelation: option(numberListKind(parameters.noiseCorrelation), {
    name: "noiseCorrelation",
    argument: "<rho>",
    help: "assumed correlation of the books' noises, or a comma-separated list: the identified set under each (a sensitivity table)",
    group: "model",
    commands: ["solve"],
  }),
} as const;
