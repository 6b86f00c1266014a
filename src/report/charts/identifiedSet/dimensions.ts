/** Pixel sizes of the identified-set chart: the plot, the margins, the title block and the landmark lane. */

/** Size of the plotting area in pixels (axes, lane, legend and caption come on top). */
export const plotWidth = 660;
export const plotHeight = 320;

/** Margins around the plot for the axes and the labels that may run past its right edge. */
export const marginLeft = 96;
export const marginRight = 72;
/** Width the caption lines are wrapped to (the title block starts left of the y axis title). */
export const captionWidth = marginLeft + plotWidth + marginRight - 40;

/** Height of the title, the caption lines and the gap to the plot's contents (chartConfig's sizes). */
export function titleBlockHeight(subtitleLines: number): number {
  return 22 + 8 + 16 * subtitleLines + 16;
}

export const laneRowHeight = 21;
export const laneGap = 10;
export const labelFontSize = 11.5;
