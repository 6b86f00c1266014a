/**
 * Text report sections about sampling uncertainty: the bounds with their standard errors and limits,
 * intervals for the structural betas themselves, Sharpe ratios with standard errors, the bootstrap
 * summary, and a plain-language reading of which numbers are well determined.
 */

import { bootstrapQuantities, type BootstrapQuantity } from "../../core/inference/bootstrap/statistics.js";
import { normalQuantile } from "../../core/numerics/normal.js";
import type { Uncertainty } from "../../core/inference/uncertaintyTypes.js";
import type { IdentifiedBounds, Solution } from "../../core/types.js";
import { formatNumber } from "../format.js";
import { type Section, sectionLines } from "../blocks.js";
import { landmarkWords } from "../conventions.js";
import type { Style } from "../layout.js";

const percent = (confidence: number): string => `${Number((confidence * 100).toPrecision(4))}%`;
const limits = (lower: number, upper: number): string => `${formatNumber(lower)} to ${formatNumber(upper)}`;

const intervalNames = { "imbens-manski": "Imbens-Manski", stoye: "Stoye" } as const;

/** The identified set with a standard error and pointwise limits for each bound, and the beta intervals. */
export function boundsWithUncertainty(bounds: IdentifiedBounds, u: Uncertainty): Section | null {
  const c = percent(u.confidence);
  if (u.bounds === null || u.lowBeta === null || u.highBeta === null) return null;
  const b = u.bounds;
  const row = (label: string, end: string, p: { estimate: number; stdError: number; lower: number; upper: number }) => [
    label,
    end,
    formatNumber(p.estimate),
    formatNumber(p.stdError),
    limits(p.lower, p.upper),
  ];
  const source =
    u.method.intervalSource === "bootstrap"
      ? "bootstrap"
      : `delta method, ${u.method.longRun === "hac" ? "HAC" : "iid"} long-run covariance`;
  const method = intervalNames[u.lowBeta.interval.method];
  // Bartlett long-run variances and bootstrap standard errors take fixed-b critical values (docs/methods.md §4, §7.2).
  const fixedB = u.method.intervalSource === "bootstrap" || (u.method.longRun === "hac" && u.method.kernel === "bartlett");
  return {
    id: "precision",
    heading: `How precisely the set is known (${c} confidence)`,
    blocks: [
      {
        kind: "table",
        header: ["", "", "estimate", "std. error", `${c} limits\nof this end`],
        rows: [
          row("low structural beta", "lower end", b.lowBeta.min),
          row("", "upper end", b.lowBeta.max),
          row("high structural beta", "lower end", b.highBeta.min),
          row("", "upper end", b.highBeta.max),
        ],
      },
      {
        kind: "paragraph",
        text:
          `Standard errors: ${source}; correlation of the two ends ${formatNumber(b.correlation, 3)}.` +
          `${fixedB ? " Limits use fixed-b critical values (Kiefer-Vogelsang 2005)." : ""}`,
      },
      { kind: "gap" },
      {
        kind: "fields",
        pairs: [
          [`low structural beta (${method}, ${c})`, limits(u.lowBeta.interval.lower, u.lowBeta.interval.upper)],
          [`high structural beta (${method}, ${c})`, limits(u.highBeta.interval.lower, u.highBeta.interval.upper)],
        ],
      },
      {
        kind: "paragraph",
        text:
          `These intervals cover the true structural beta, wherever it lies in the set, with ${c} probability: ` +
          `wider than the set [${formatNumber(bounds.lowBeta.min)}, ${formatNumber(bounds.lowBeta.max)}] by the sampling error of its ends, ` +
          "and cut to the betas' admissible range (above 0, with b_low below 1/w).",
      },
    ],
  };
}

/** The text of boundsWithUncertainty; none when there are no bounds' standard errors. */
export function boundsWithUncertaintySection(bounds: IdentifiedBounds, u: Uncertainty, style: Style): string[] {
  const section = boundsWithUncertainty(bounds, u);
  return section === null ? [] : sectionLines(section, style);
}

/** Per-period Sharpe ratios with Lo (2002) iid-normal, Mertens (2002) iid and HAC standard errors. */
export function sharpe(u: Uncertainty, periodsPerYear: number | null, excess = true): Section {
  const names = ["low", "high", "market"] as const;
  const annual = periodsPerYear === null ? null : Math.sqrt(periodsPerYear);
  return {
    id: "sharpe",
    heading: `Sharpe ratios (${excess ? "excess returns" : "returns: no risk-free rate given"})`,
    blocks: [
      {
        kind: "table",
        header: [
          "",
          "per period",
          "iid normal\nstd. error",
          "iid (Mertens)\nstd. error",
          "HAC\nstd. error",
          ...(annual === null ? [] : [`annualised\n(x sqrt(${periodsPerYear}))`]),
        ],
        rows: names.map((name) => {
          const s = u.sharpe[name];
          return [
            name,
            formatNumber(s.estimate),
            formatNumber(s.iidStdErr),
            formatNumber(s.mertensStdErr),
            formatNumber(s.hacStdErr),
            ...(annual === null ? [] : [formatNumber(s.estimate * annual)]),
          ];
        }),
      },
    ],
  };
}

export function sharpeSection(u: Uncertainty, periodsPerYear: number | null, style: Style, excess = true): string[] {
  return sectionLines(sharpe(u, periodsPerYear, excess), style);
}

const quantityLabels: Record<BootstrapQuantity, string> = {
  lowBetaMin: "low beta, lower end",
  lowBetaMax: "low beta, upper end",
  highBetaMin: "high beta, lower end",
  highBetaMax: "high beta, upper end",
  lowCapmBeta: "CAPM beta, low",
  highCapmBeta: "CAPM beta, high",
  lowCapmAlpha: "CAPM alpha, low",
  highCapmAlpha: "CAPM alpha, high",
  capmConsistentLowBeta: `${landmarkWords.capmConsistent} low beta`,
  equalNoiseLowBeta: `${landmarkWords.equalNoise} low beta`,
  returnImpliedLowBeta: `${landmarkWords.returnImplied} low beta`,
  lowSharpe: "Sharpe ratio, low",
  highSharpe: "Sharpe ratio, high",
  marketSharpe: "Sharpe ratio, market",
};

/** The bootstrap's percentile intervals and standard errors; null without a bootstrap. */
export function bootstrap(u: Uncertainty): Section | null {
  const bs = u.bootstrap;
  if (bs === null) return null;
  const c = percent(bs.confidence);
  return {
    id: "bootstrap",
    heading: `Stationary bootstrap (${bs.replicates} replicates, mean block length ${formatNumber(bs.blockLength, 3)}, seed ${bs.seed})`,
    blocks: [
      {
        kind: "table",
        header: ["", "std. error", `${c} percentile\ninterval`, "replicates\nused"],
        rows: bootstrapQuantities.map((q) => {
          const interval = bs.intervals[q];
          return [
            quantityLabels[q],
            formatNumber(bs.stdErrors[q]),
            interval === null ? "n/a" : limits(interval.lower, interval.upper),
            String(bs.validReplicates[q]),
          ];
        }),
      },
    ],
  };
}

export function bootstrapSection(u: Uncertainty, style: Style): string[] {
  const section = bootstrap(u);
  return section === null ? [] : sectionLines(section, style);
}

/** Plain sentences: which headline numbers are well determined and which are not. */
export function precision(solution: Solution, u: Uncertainty): Section {
  const c = percent(u.confidence);
  const z = normalQuantile(1 - (1 - u.confidence) / 2);
  const lines: string[] = [];
  for (const book of ["low", "high"] as const) {
    const fit = solution.capm[book];
    const se = u.capm[book].hac.alphaStdErr;
    const t = se > 0 ? fit.alpha / se : null;
    const verdict =
      t === null ? "its standard error is 0" : Math.abs(t) < z ? "not distinguishable from zero" : "distinguishable from zero";
    lines.push(`CAPM alpha of the ${book} book: ${formatNumber(fit.alpha)} +/- ${formatNumber(z * se, 2)} (${c}, HAC): ${verdict}.`);
  }
  if (u.bounds !== null && solution.bounds !== null) {
    const width = solution.bounds.lowBeta.max - solution.bounds.lowBeta.min;
    const error = z * Math.max(u.bounds.lowBeta.min.stdError, u.bounds.lowBeta.max.stdError);
    if (error > 0) {
      const ratio = width / error;
      const verdict =
        ratio >= 2
          ? "so the range itself is well determined"
          : "so sampling error is as large as the set itself: rely on the interval below, not on the set";
      lines.push(
        `Ends of the set of the low structural beta: each known to about +/- ${formatNumber(error, 2)} (${c}); ` +
          `the set is ${formatNumber(width, 3)} wide, ${formatNumber(ratio, 2)} times that, ${verdict}.`,
      );
    } else {
      lines.push(`Ends of the set of the low structural beta: their standard errors are 0; the set is ${formatNumber(width, 3)} wide.`);
    }
  }
  if (u.lowBeta !== null) {
    lines.push(`Low structural beta itself: from ${limits(u.lowBeta.interval.lower, u.lowBeta.interval.upper)} with ${c} confidence.`);
  }
  const low = u.sharpe.low;
  lines.push(
    `Sharpe ratio of the low book: ${formatNumber(low.estimate)} per period +/- ${formatNumber(z * low.hacStdErr, 2)} (${c}, HAC)` +
      (Math.abs(low.estimate) < z * low.hacStdErr ? ": not distinguishable from zero." : "."),
  );
  return { id: "reading", heading: "Reading the uncertainty", blocks: [{ kind: "list", items: lines }] };
}

export function precisionSection(solution: Solution, u: Uncertainty, style: Style): string[] {
  return sectionLines(precision(solution, u), style);
}
