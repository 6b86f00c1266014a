/** The identified-set chart's options: what the y axis shows and the optional sampling-uncertainty bars. */

export interface BetaInterval {
  readonly lower: number;
  readonly upper: number;
}

export interface IdentifiedSetUncertainty {
  /** An interval for the low structural beta itself (e.g. a confidence interval covering the set). */
  readonly lowBetaInterval?: BetaInterval;
  /** Intervals for each end of the identified set. */
  readonly boundIntervals?: { readonly min: BetaInterval; readonly max: BetaInterval };
  /** The intervals' confidence level (e.g. 0.95), shown in their labels when given. */
  readonly confidence?: number;
}

export interface IdentifiedSetChartOptions {
  /** What the y axis shows: both noise variances, or the low book's share of the noise. */
  readonly y: "variance" | "share";
  readonly uncertainty?: IdentifiedSetUncertainty;
}

/** What the y axis shows. */
export type YQuantity = IdentifiedSetChartOptions["y"];
