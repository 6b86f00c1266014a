/** The extensions of the two-book model: an independent index and correlated noise (entries of the option table, table.ts). */
import { nameListKind, numberListKind, textKind } from "../kinds.js";
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
  portfolios: option(nameListKind(), {
    name: "portfolios",
    argument: "<columns>",
    help: "comma-separated columns of k >= 3 beta-sorted portfolios, lowest beta first: the one-factor model fitted to all of them by maximum likelihood (of the low file when joining; rows missing one are dropped)",
    group: "model",
    commands: ["solve"],
  }),
  marketWeights: option(numberListKind(parameters.marketWeight), {
    name: "marketWeights",
    argument: "<weights>",
    help: "the portfolios' weights in the market proxy, one per --portfolios column (scaled to sum to 1); equal weights when not given",
    group: "model",
    commands: ["solve"],
  }),
} as const;
