/** What the identified-set chart's y axis shows: both noise variances, or the noise shares. */
export const chartYChoices = ["variance", "share"] as const;
export type ChartY = (typeof chartYChoices)[number];
