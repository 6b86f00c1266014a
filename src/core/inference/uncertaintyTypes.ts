/**
 * The value `assessUncertainty` returns. Its JSON paths are a contract the CLI prints; every number is
 * per period, in the units of the input returns (betas and Sharpe ratios are unit-free).
 */

import type { BootstrapSummary } from "./bootstrap/summary.js";
import type { SharpeStdErrors } from "./sharpe.js";
import type { HacKernel, IntervalMethod, IntervalSource, LongRunMethod } from "./options.js";

/** One bound of the identified set with its standard error and pointwise limits estimate -/+ z se. */
export interface PointwiseBound {
  readonly estimate: number;
  readonly stdError: number;
  readonly lower: number;
  readonly upper: number;
}

/** A confidence interval for a partially identified structural beta. */
export interface BetaInterval {
  readonly lower: number;
  readonly upper: number;
  readonly method: IntervalMethod;
  /** Multipliers of the lower and upper bounds' standard errors (equal for Imbens-Manski). */
  readonly criticalValue: { readonly lower: number; readonly upper: number };
}

export interface CapmHac {
  readonly alphaStdErr: number;
  readonly betaStdErr: number;
}

export interface Uncertainty {
  readonly confidence: number;
  /** How Omega of the delta method was estimated; kernel, bandwidth and lags are null for "iid". */
  readonly method: {
    readonly longRun: LongRunMethod;
    readonly kernel: HacKernel | null;
    readonly bandwidth: number | null;
    readonly lags: number | null;
    /** Where the bounds' standard errors (and correlation) come from. */
    readonly intervalSource: IntervalSource;
  };
  readonly capm: {
    readonly low: { readonly hac: CapmHac };
    readonly high: { readonly hac: CapmHac };
    /** Settings of the CAPM HAC covariances (the same for both books: their residuals are proportional). */
    readonly hac: {
      readonly lags: number | null;
      readonly kernel: HacKernel;
      readonly bandwidth: number;
      readonly prewhite: boolean;
      readonly adjust: boolean;
    };
  };
  /** Null when the covariance of the books is not positive (no identified set). */
  readonly bounds: {
    readonly lowBeta: { readonly min: PointwiseBound; readonly max: PointwiseBound };
    readonly highBeta: { readonly min: PointwiseBound; readonly max: PointwiseBound };
    /** corr(Lb_hat, U_hat); the same for the high beta's two bounds. */
    readonly correlation: number;
  } | null;
  readonly lowBeta: { readonly interval: BetaInterval } | null;
  readonly highBeta: { readonly interval: BetaInterval } | null;
  readonly sharpe: { readonly low: SharpeStdErrors; readonly high: SharpeStdErrors; readonly market: SharpeStdErrors };
  readonly bootstrap: BootstrapSummary | null;
}
