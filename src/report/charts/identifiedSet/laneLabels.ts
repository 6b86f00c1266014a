/** Where the landmark labels go in the lane: which row, and which side of the symbol. */

import { marginLeft, marginRight, plotWidth } from "./dimensions.js";

export interface LaneItem {
  /** Pixel position of the symbol, its radius, and the label's estimated width. */
  readonly x: number;
  readonly radius: number;
  readonly width: number;
}

export interface LanePlacement {
  readonly row: number;
  /** "left": the label starts right of the symbol; "right": it ends left of it. */
  readonly align: "left" | "right";
  readonly labelX: number;
  /** Pixels the symbol and label occupy in their row. */
  readonly span: readonly [number, number];
}

/**
 * Rows and sides for the landmark labels: no two labels overlap in a row, and as far as possible no
 * guide line (which runs from a symbol down to the plot) crosses a label in a lower row. Every order
 * of the (at most five) landmarks is tried with a greedy placement; the best is kept by fewest
 * crossings, then fewest rows, then fewest labels left of their symbol. Deterministic: ties keep the
 * first order found.
 */
export function placeLaneLabels(items: readonly LaneItem[]): LanePlacement[] {
  const options = (item: LaneItem): Omit<LanePlacement, "row">[] => {
    const { x, radius: r, width: w } = item;
    const all: Omit<LanePlacement, "row">[] = [
      { align: "left", span: [x - r, x + r + 6 + w], labelX: x + r + 5 },
      { align: "right", span: [x - r - 6 - w, x + r], labelX: x - r - 5 },
    ];
    const fits = all.filter((o) => o.span[1] <= plotWidth + marginRight - 8 && o.span[0] >= 8 - marginLeft);
    return fits.length > 0 ? fits : all.slice(0, 1);
  };
  const greedy = (order: readonly number[]): LanePlacement[] => {
    const placed: (LanePlacement | undefined)[] = items.map(() => undefined);
    const done: { x: number; p: LanePlacement }[] = [];
    const free = (k: number, span: readonly [number, number]): boolean =>
      done.every(({ p }) => p.row !== k || span[1] + 10 <= p.span[0] || span[0] >= p.span[1] + 10);
    const clean = (k: number, x: number, span: readonly [number, number]): boolean =>
      free(k, span) &&
      done.every(({ x: gx, p }) => (p.row > k ? gx < span[0] - 2 || gx > span[1] + 2 : true)) &&
      done.every(({ p }) => (p.row < k ? x < p.span[0] - 2 || x > p.span[1] + 2 : true));
    for (const i of order) {
      const item = items[i]!;
      const rowsInUse = Math.max(0, ...done.map(({ p }) => p.row + 1));
      let chosen: LanePlacement | undefined;
      for (let k = 0; k <= rowsInUse && chosen === undefined; k++) {
        const o = options(item).find((c) => clean(k, item.x, c.span));
        if (o !== undefined) chosen = { ...o, row: k };
      }
      for (let k = 0; chosen === undefined; k++) {
        const o = options(item).find((c) => free(k, c.span));
        if (o !== undefined) chosen = { ...o, row: k };
      }
      placed[i] = chosen;
      done.push({ x: item.x, p: chosen });
    }
    return placed.map((p) => p!);
  };
  const crossings = (placement: readonly LanePlacement[]): number => {
    let n = 0;
    for (const [i, p] of placement.entries()) {
      const x = items[i]!.x;
      for (const [j, q] of placement.entries()) if (j !== i && q.row < p.row && x >= q.span[0] - 2 && x <= q.span[1] + 2) n++;
    }
    return n;
  };
  let best: { score: number; placement: LanePlacement[] } | null = null;
  for (const order of permutations(items.map((_, i) => i))) {
    const placement = greedy(order);
    const rows = Math.max(0, ...placement.map((p) => p.row + 1));
    const score = crossings(placement) * 10_000 + rows * 100 + placement.filter((p) => p.align === "right").length;
    if (best === null || score < best.score) best = { score, placement };
  }
  return best?.placement ?? [];
}

/** Every ordering of `xs`, in lexicographic order of positions. */
function permutations(xs: readonly number[]): number[][] {
  if (xs.length <= 1) return [[...xs]];
  return xs.flatMap((x, i) => permutations([...xs.slice(0, i), ...xs.slice(i + 1)]).map((rest) => [x, ...rest]));
}
