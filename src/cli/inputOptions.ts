/** The commander options shared by every command that reads return files (solve, roll). */
import { Option, type Command } from "commander";
import { numberArgument, openUnitInterval, wholeNumber } from "./arguments.js";
import { collectPair, columnList } from "./pairs.js";
import { inputKinds, missingPolicies, solveDefaults, unitChoices } from "./options.js";

export function addInputOptions(command: Command): Command {
  return command
    .option("--low <column>", "column of the low-beta book's returns (PATH:COLUMN to read it from its own file)")
    .option("--high <column>", "column of the high-beta book's returns (PATH:COLUMN: joined with --low on date)")
    .option("--pair <low:high>", "a pair of columns to solve (repeatable)", collectPair)
    .option("--lows <columns>", "comma-separated low-beta columns: every combination with --highs", columnList)
    .option("--highs <columns>", "comma-separated high-beta columns", columnList)
    .option("--date <column>", "date column (default: the first column)")
    .addOption(
      new Option("--weight <w>", "weight of the low book in the market proxy, 0 < w < 1")
        .argParser(openUnitInterval)
        .default(solveDefaults.weight),
    )
    .option("--rf <column|number>", "risk-free return per period: a column name or a constant (default 0)")
    .addOption(new Option("--units <units>", "units of the file's numbers").choices(unitChoices).default(solveDefaults.units))
    .option("--output <path>", "write the output to this file (atomically) instead of standard output")
    .option("--allow-extreme", "accept returns above 10 (1000%) in absolute value", false)
    .option("--delimiter <char>", "field delimiter (default: detected among comma, semicolon, tab)")
    .option("--block <n>", "which table of the file when blank lines separate several (1-based)", wholeNumber(1, 1_000_000))
    .option("--date-format <layout>", "explicit date layout, e.g. DD/MM/YYYY, MM/DD/YYYY, D MMM YYYY")
    .option("--sort", "sort rows by date instead of reporting unsorted dates", false)
    .option("--decimal-comma", "numbers use a decimal comma (1,5 is 1.5; use with a semicolon or tab delimiter)", false)
    .option(
      "--periods-per-year <n>",
      "override the detected frequency",
      numberArgument("must be a positive number", (x) => x > 0),
    )
    .option("--missing <values>", "extra missing-value markers, comma-separated (e.g. -99.99,-999)", columnList)
    .addOption(
      new Option("--on-missing <policy>", "drop rows with a missing value, or treat them as errors")
        .choices(missingPolicies)
        .default("drop"),
    )
    .addOption(new Option("--input <kind>", "what the numbers are").choices(inputKinds).default("returns"))
    .option("--id-column <column>", "long layout: the column naming the series (then --low/--high name series)")
    .option("--value-column <column>", "long layout: the column holding the values");
}
