/** Commander argument parsers: strict numbers with the expected range stated in the error. */
import { InvalidArgumentError } from "commander";
import { parseDecimal } from "../input/values/numbers.js";

/** A parser accepting a strict decimal number for which `accept` holds; `expected` is the error text. */
export function numberArgument(expected: string, accept: (x: number) => boolean = () => true) {
  return (value: string): number => {
    const x = parseDecimal(value);
    if (x === null || !accept(x)) throw new InvalidArgumentError(expected);
    return x;
  };
}

export const positiveNumber = numberArgument("must be a positive number", (x) => x > 0);
export const nonNegativeNumber = numberArgument("must be a number >= 0", (x) => x >= 0);
export const anyNumber = numberArgument("must be a number");
export const openUnitInterval = numberArgument("must be a number strictly between 0 and 1", (x) => x > 0 && x < 1);

export function wholeNumber(minimum: number, maximum: number) {
  return numberArgument(`must be a whole number from ${minimum} to ${maximum}`, (x) => Number.isInteger(x) && x >= minimum && x <= maximum);
}

/** Comma-separated list of exactly `count` non-empty names. */
export function nameList(count: number) {
  return (value: string): string[] => {
    const names = value.split(",").map((s) => s.trim());
    if (names.length !== count || names.some((s) => s === "")) {
      throw new InvalidArgumentError(`must be ${count} comma-separated non-empty names`);
    }
    return names;
  };
}
