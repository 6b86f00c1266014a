import { afterEach, describe, expect, test } from "vitest";
import { solve } from "../../../src/core/solve.js";
import { drawSample } from "../../../src/core/forward/simulate.js";
import { cautionCaption } from "../../../src/report/charts/common.js";
import { renderRollChart, type RollWindowPoint, timestamp } from "../../../src/report/charts/rollChart.js";
import { facetItems, groupWithClass, hasMark, markItems, parseSvg, texts } from "./svg.js";

const meta = { source: "examples/books.csv", window: "24 months" };

/** Rolling 24-period windows over a simulated monthly sample, month-end dates from 2015-01-31. */
function windows(count = 30): RollWindowPoint[] {
  const n = count + 23;
  const sample = drawSample(
    { lowBeta: 0.7, weight: 0.5, factorVol: 0.04, factorMean: 0.006, lowNoiseVol: 0.012, highNoiseVol: 0.02 },
    { periods: n, seed: 42 },
  );
  const out: RollWindowPoint[] = [];
  for (let end = 24; end <= n; end++) {
    const result = solve({ low: sample.low.slice(end - 24, end), high: sample.high.slice(end - 24, end) });
    if (!result.ok) throw new Error("fixture did not solve");
    const b = result.value.bounds!;
    const date = new Date(Date.UTC(2015, end - 1 + 1, 0)).toISOString().slice(0, 10);
    out.push({ end: date, lowBetaMin: b.lowBeta.min, lowBetaMax: b.lowBeta.max, capmLowBeta: result.value.capm.low.beta });
  }
  return out;
}

/** Removes the set from the windows at `indexes` (as if the model were rejected there). */
function withGaps(ws: readonly RollWindowPoint[], indexes: readonly number[]): RollWindowPoint[] {
  return ws.map((w, i) => (indexes.includes(i) ? { ...w, lowBetaMin: null, lowBetaMax: null } : w));
}

const originalTz = process.env.TZ;
afterEach(() => {
  if (originalTz === undefined) delete process.env.TZ;
  else process.env.TZ = originalTz;
});

describe("renderRollChart", () => {
  test("returns well-formed SVG with the band, the CAPM line, axis titles with units and a title", async () => {
    const root = parseSvg(await renderRollChart(windows(), meta));
    expect(facetItems(root, "set-band")).toHaveLength(1);
    expect(markItems(root, "capm-line")).toHaveLength(1);
    const shown = texts(root);
    expect(shown).toContain("window end date");
    expect(shown).toContain("low structural beta (b_low)");
    expect(root.children.find((e) => e.tag === "title")?.text).toMatch(/identified set/);
  });

  test("leaves a gap in the band for every run of windows without a set, and marks those windows", async () => {
    const ws = withGaps(windows(), [5, 6, 7, 15]);
    const root = parseSvg(await renderRollChart(ws, meta));
    // Runs with a set: 0-4, 8-14, 16-29: three separate areas.
    expect(facetItems(root, "set-band")).toHaveLength(3);
    const crosses = markItems(root, "no-set-marker");
    expect(crosses).toHaveLength(4);
    expect(crosses[0]?.attrs["aria-label"]).toBe(`Window ending ${ws[5]!.end}: no identified set.`);
    expect(texts(root).join(" ")).toContain("no identified set in this window");
  });

  test("draws a single window between two gaps as a bar, not as an invisible area", async () => {
    const root = parseSvg(await renderRollChart(withGaps(windows(), [9, 11]), meta));
    expect(markItems(root, "set-band-single")).toHaveLength(1);
  });

  test("draws the interval as a lighter band only when windows carry one", async () => {
    const plain = parseSvg(await renderRollChart(windows(), meta));
    expect(hasMark(plain, "interval-band")).toBe(false);
    const ws = windows().map((w) => ({ ...w, interval: { lower: w.lowBetaMin! - 0.05, upper: w.lowBetaMax! + 0.05 } }));
    const root = parseSvg(await renderRollChart(ws, meta));
    const [interval] = facetItems(root, "interval-band");
    const [set] = facetItems(root, "set-band");
    expect(Number(interval?.attrs["fill-opacity"] ?? 1)).toBeGreaterThanOrEqual(Number(set?.attrs["fill-opacity"] ?? 1));
    expect(interval?.attrs.fill).not.toBe(set?.attrs.fill);
  });

  test("states the source, the window, the date range, the assumptions and the caution", async () => {
    const ws = windows();
    const caption = texts(groupWithClass(parseSvg(await renderRollChart(ws, meta)), "role-title-subtitle")).join(" ");
    expect(caption).toContain(meta.source);
    expect(caption).toContain(`Data: ${meta.source}; ${meta.window};`);
    expect(caption).toContain(`${ws.length} windows ending ${ws[0]!.end} to ${ws[ws.length - 1]!.end}`);
    expect(caption).toMatch(/Assumptions: one common factor/);
    expect(caption).toContain(cautionCaption);
  });

  test("is deterministic and independent of the machine's time zone", async () => {
    const ws = windows();
    process.env.TZ = "UTC";
    const utc = await renderRollChart(ws, meta);
    process.env.TZ = "Pacific/Kiritimati";
    const far = await renderRollChart(ws, meta);
    process.env.TZ = "America/Los_Angeles";
    const west = await renderRollChart(ws, meta);
    expect(far).toBe(utc);
    expect(west).toBe(utc);
    expect(utc).not.toMatch(/\sid="/);
  });

  test("sorts the windows by date, so the order they come in does not matter", async () => {
    const ws = windows();
    expect(await renderRollChart([...ws].reverse(), meta)).toBe(await renderRollChart(ws, meta));
  });

  test("escapes markup in the source name and refuses a window end that is not an ISO date", async () => {
    const svg = await renderRollChart(windows(), { source: "<script>x</script>.csv", window: "24 & more" });
    parseSvg(svg);
    expect(svg).not.toContain("<script");
    const bad = [{ end: "31/01/2020", lowBetaMin: 0.6, lowBetaMax: 0.8, capmLowBeta: 0.7 }];
    await expect(renderRollChart(bad, meta)).rejects.toThrow(RangeError);
  });

  test("says there is nothing to draw when there are no windows", async () => {
    const root = parseSvg(await renderRollChart([], meta));
    expect(texts(root)).toContain("No rolling windows to draw");
  });
});

describe("window end dates on the time axis", () => {
  // Expected values from the platform's own ISO 8601 parser (Date.parse), with the zone written out.
  test.each([
    ["2020", "2020-01-01T00:00:00Z"],
    ["2020-03", "2020-03-01T00:00:00Z"],
    ["2020-03-31", "2020-03-31T00:00:00Z"],
    ["2020-03-31T09:30", "2020-03-31T09:30:00Z"],
    ["2020-03-31T09:30:15.25Z", "2020-03-31T09:30:15.250Z"],
    ["2020-03-31T09:30:00+02:00", "2020-03-31T09:30:00+02:00"],
    ["2020-03-31 09:30:00-0530", "2020-03-31T09:30:00-05:30"],
  ])("%s", (end, iso) => {
    expect(timestamp(end)).toBe(Date.parse(iso));
  });

  test("anything else is a bug upstream, refused", () => {
    expect(() => timestamp("03/31/2020")).toThrow(RangeError);
    expect(() => timestamp("")).toThrow(RangeError);
  });
});
