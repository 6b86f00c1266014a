/**
 * The pricing step of a solve (docs/methods.md §26, §30): the pricing section of the report, and the
 * solution's return-implied landmark and diagnostics made to follow the test rather than the point
 * estimates. With standard errors on, Fieller's condition is applied with the HAC variance of the
 * market mean (the core applied it with the iid one), and a return-implied point outside the set is a
 * warning only when the test rejects at the report's confidence; otherwise it is an info that gives
 * the p-value. With standard errors off the section holds the point figures only and no verdict.
 */
import { type Diagnostic, diagnose } from "../core/diagnostics.js";
import type { Uncertainty } from "../core/inference/uncertaintyTypes.js";
import { structureAt, summaryOfMoments } from "../core/identify.js";
import { fiellerCriticalValue, structureExists } from "../core/landmarks.js";
import { type AlphaDecomposition, assessPricing, type Pricing } from "../core/pricing/assessPricing.js";
import type { SolvedMoments } from "../core/solve.js";
import type { ReturnSample, Solution } from "../core/types.js";
import type { CommandOptions } from "../options/index.js";
import type { PricingJson } from "../schema/pricing.js";
import { hacOptions } from "./uncertaintyStep.js";

export const pricingTestMethod =
  "moment inequalities on mean low - b mean market at the set's ends (joint delta method), generalized moment selection " +
  "(Andrews-Soares 2010) with the max statistic; 'explained' by the intersection-union test (Berger 1982)";

const pointDiagnostics = new Set(["market-mean-near-zero", "return-implied-outside-not-significant", "return-implied-outside-set"]);

/** The pricing section (null without a set) and the solution with its return-implied landmark and diagnostics decided by the test. */
export function pricingFor(
  sample: ReturnSample,
  solution: Solution,
  uncertainty: Uncertainty | null,
  options: CommandOptions<"solve">,
  input: { readonly periodsPerYear: number | null; readonly excessReturns: boolean; readonly solved?: SolvedMoments },
): { pricing: PricingJson | null; solution: Solution } {
  if (solution.bounds === null || solution.landmarks === null) return { pricing: null, solution };
  const tested = uncertainty !== null;
  const assessed = assessPricing(sample, {
    weight: options.weight,
    confidence: options.confidence,
    longRun: options.longRun,
    // Without standard errors the report keeps only the point figures.
    pointOnly: !tested,
    hac: hacOptions(options),
    ...(input.solved === undefined ? {} : { solved: input.solved }),
    ...(tested ? { alphaStdErrors: { low: uncertainty.capm.low.hac.alphaStdErr, high: uncertainty.capm.high.hac.alphaStdErr } } : {}),
  });
  if (assessed === null) return { pricing: null, solution };
  const pricing = pricingJson(assessed, uncertainty, input.excessReturns, input.periodsPerYear);
  return { pricing, solution: tested ? decidedByTest(solution, assessed) : solution };
}

/** The solution with the return-implied landmark kept by Fieller's condition (HAC) and the outside diagnostics by the test. */
function decidedByTest(solution: Solution, pricing: Pricing): Solution {
  const { bounds, landmarks, moments, weight } = solution;
  if (bounds === null || landmarks === null) return solution;
  const kept = solution.diagnostics.filter((d) => !pointDiagnostics.has(d.code));
  const added: Diagnostic[] = [];
  const { fieller, estimate, marketMeanTStat } = pricing.returnImplied;
  // The landmark: only where Fieller's set is bounded (at the report's confidence) and a structure exists.
  let returnImplied = null;
  if (fieller.shape !== "bounded" || estimate === null) {
    const criticalValue = fiellerCriticalValue(pricing.confidence);
    added.push(diagnose({ code: "market-mean-near-zero", marketMean: moments.market.mean, tStat: marketMeanTStat, criticalValue }));
  } else if (structureExists(estimate, weight)) {
    returnImplied = landmarks.returnImplied ?? structureAt(estimate, summaryOfMoments(weight, moments));
  }
  // The verdict on "outside the set" comes from the test, whether or not the point itself is reported
  // (the test is written in the means and needs no bounded ratio).
  const { min, max } = bounds.lowBeta;
  const test = pricing.test;
  if (estimate !== null && (estimate < min || estimate > max)) {
    const significant = test !== null && test.verdict === "not explained";
    added.push(
      significant
        ? diagnose({ code: "return-implied-outside-set", lowBeta: estimate, min, max, pValue: test.pValue, confidence: pricing.confidence })
        : diagnose({
            code: "return-implied-outside-not-significant",
            lowBeta: estimate,
            min,
            max,
            pValue: test?.pValue ?? null,
            confidence: test === null ? null : pricing.confidence,
          }),
    );
  }
  return { ...solution, landmarks: { ...landmarks, returnImplied }, diagnostics: [...kept, ...added] };
}

function pricingJson(p: Pricing, uncertainty: Uncertainty | null, excessReturns: boolean, periodsPerYear: number | null): PricingJson {
  const tested = uncertainty !== null;
  const { fieller } = p.returnImplied;
  const bootstrap = uncertainty?.bootstrap?.intervals.returnImpliedLowBeta ?? null;
  const decomposition = (a: AlphaDecomposition) => {
    const perPeriod = {
      observed: a.observed,
      observedLower: a.observedLower,
      observedUpper: a.observedUpper,
      explainableMin: a.explainableMin,
      explainableMax: a.explainableMax,
      explainableMinStdError: tested ? a.explainableMinStdError : null,
      explainableMaxStdError: tested ? a.explainableMaxStdError : null,
      unexplained: a.unexplained,
    };
    const times = (x: number | null) => (x === null || periodsPerYear === null ? null : x * periodsPerYear);
    const annualised =
      periodsPerYear === null
        ? null
        : {
            observed: perPeriod.observed * periodsPerYear,
            observedLower: times(perPeriod.observedLower),
            observedUpper: times(perPeriod.observedUpper),
            explainableMin: perPeriod.explainableMin * periodsPerYear,
            explainableMax: perPeriod.explainableMax * periodsPerYear,
            explainableMinStdError: times(perPeriod.explainableMinStdError),
            explainableMaxStdError: times(perPeriod.explainableMaxStdError),
            unexplained: perPeriod.unexplained * periodsPerYear,
          };
    return { ...perPeriod, annualised };
  };
  return {
    excessReturns,
    confidence: p.confidence,
    returnImpliedLowBeta: {
      estimate: p.returnImplied.estimate,
      stdError: tested ? p.returnImplied.stdError : null,
      lower: tested && fieller.shape === "bounded" ? fieller.lower : null,
      upper: tested && fieller.shape === "bounded" ? fieller.upper : null,
      shape: tested ? fieller.shape : null,
      outsideOf: tested && fieller.shape === "two-rays" ? [fieller.lower, fieller.upper] : null,
      method: "fieller",
      bootstrapLower: bootstrap?.lower ?? null,
      bootstrapUpper: bootstrap?.upper ?? null,
    },
    test:
      tested && p.test !== null
        ? {
            statistic: p.test.statistic,
            pValue: p.test.pValue,
            explainedPValue: p.test.explainedPValue,
            method: pricingTestMethod,
            verdict: p.test.verdict,
          }
        : null,
    alpha: { low: decomposition(p.alpha.low), high: decomposition(p.alpha.high) },
  };
}
