/**
 * The simulate job: a structure and the simulation settings in, a seeded sample out (dates and both
 * books' returns). The same options give the same numbers, bit for bit.
 */
import { periodDates } from "../core/calendar.js";
import { drawSample } from "../core/forward/simulate.js";
import { type Result, success } from "../core/result.js";
import { type CommandOptions, type CommandOptionsInput, type OptionIssue, parseOptions } from "../options/index.js";
import type { SampleColumns } from "../report/simulatedSample.js";

export interface SimulateJobResult {
  readonly options: CommandOptions<"simulate">;
  readonly sample: SampleColumns;
}

export function simulateJob(input: CommandOptionsInput<"simulate">): Result<SimulateJobResult, OptionIssue> {
  const parsed = parseOptions("simulate", input);
  if (!parsed.ok) return parsed;
  const options = parsed.value;
  const { lowBeta, weight, factorVol, factorMean, lowNoiseVol, highNoiseVol } = options;
  // The option table checks every rule simulateSample checks: the options here are valid.
  const drawn = drawSample(
    { lowBeta, weight, factorVol, factorMean, lowNoiseVol, highNoiseVol },
    {
      periods: options.periods,
      seed: options.seed,
      riskFree: options.rf,
      ...(options.tails === undefined ? {} : { tails: options.tails }),
      ...(options.noiseAr === undefined ? {} : { noiseAr: options.noiseAr }),
      ...(options.garch === undefined ? {} : { garch: options.garch }),
    },
  );
  const [date, low, high] = options.names;
  const sample: SampleColumns = {
    dates: periodDates(options.frequency, options.start, options.periods),
    low: drawn.low,
    high: drawn.high,
    names: [date ?? "date", low ?? "low", high ?? "high"],
  };
  return success({ options, sample });
}
