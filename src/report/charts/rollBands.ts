/** The bands of the roll chart: one area per run of consecutive windows, so that gaps stay gaps. */
import type { Mark } from "vega";

/** Consecutive rows for which `has` holds, numbered, with their length. */
export function runs<T extends object>(rows: readonly T[], has: (r: T) => boolean): { segment: number; length: number; row: T }[] {
  const out: { segment: number; length: number; row: T }[] = [];
  let segment = -1;
  let start = 0;
  for (const [i, row] of rows.entries()) {
    if (!has(row)) continue;
    if (i === 0 || !has(rows[i - 1]!)) {
      segment++;
      start = out.length;
    }
    out.push({ segment, length: 0, row });
    const length = out.length - start;
    for (let k = start; k < out.length; k++) out[k] = { ...out[k]!, length };
  }
  return out;
}

/** One area per run of windows (so gaps stay gaps), and a short bar for a run of one window. */
export function bandMarks(data: string, name: string, low: string, high: string, fill: string, stroke: string, opacity: number): Mark[] {
  return [
    {
      type: "group",
      name: `${name}-runs`,
      aria: false,
      from: { facet: { name: `${data}-run`, data, groupby: "segment" } },
      marks: [
        {
          type: "area",
          name,
          from: { data: `${data}-run` },
          encode: {
            enter: {
              x: { scale: "x", field: "t" },
              y: { scale: "y", field: high },
              y2: { scale: "y", field: low },
              fill: { value: fill },
              fillOpacity: { value: opacity },
              stroke: { value: stroke },
              strokeWidth: { value: 0.8 },
              strokeOpacity: { value: 0.8 },
              description: { value: name === "set-band" ? "identified set of the low structural beta" : "sampling interval" },
              ariaRoleDescription: { value: "band" },
            },
          },
        },
      ],
    },
    {
      type: "rect",
      name: `${name}-single`,
      aria: false,
      from: { data: `${data}-single` },
      encode: {
        enter: {
          xc: { scale: "x", field: "t" },
          width: { value: 3 },
          y: { scale: "y", field: high },
          y2: { scale: "y", field: low },
          fill: { value: fill },
          fillOpacity: { value: Math.min(1, opacity * 2) },
        },
      },
    },
  ];
}
