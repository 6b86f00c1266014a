import { describe, expect, test } from "vitest";
import { correlatedNoiseSet } from "../../../src/core/models/correlatedNoise.js";
import { landmarkNames } from "../../../src/core/types.js";
import { landmarkWords } from "../../../src/report/conventions.js";
import { cautionCaption } from "../../../src/report/charts/common.js";
import {
  landmarkLabels,
  outsideLabel,
  renderIdentifiedSetChart,
  type IdentifiedSetChartOptions,
} from "../../../src/report/charts/identifiedSetChart.js";
import type { SolveReport } from "../../../src/report/types.js";
import { rejectedSolution, reportOf, solvedFixtures, typicalSolution, zeroMeanSolution } from "../fixtures.js";
import {
  descendants,
  groupWithClass,
  hasMark,
  markItems,
  parseSvg,
  rectExtent,
  symbolArea,
  texts,
  translation,
  xAxisScale,
} from "./svg.js";

const variance: IdentifiedSetChartOptions = { y: "variance" };
const share: IdentifiedSetChartOptions = { y: "share" };

/** Half a pixel of rounding either way, plus the half-pixel shift Vega gives axes. */
const pixelTolerance = 1;

function presentLandmarks(report: SolveReport): number {
  const l = report.solution.landmarks!;
  return landmarkNames.filter((name) => l[name] !== null).length;
}

describe("renderIdentifiedSetChart", () => {
  test("returns well-formed SVG with a title and a description for every fixture and both y choices", async () => {
    for (const [name, solution] of Object.entries(solvedFixtures())) {
      for (const options of [variance, share]) {
        const root = parseSvg(await renderIdentifiedSetChart(reportOf(solution), options));
        const title = root.children.find((e) => e.tag === "title");
        expect(title?.text, `${name} ${options.y}`).toMatch(/identified set/i);
        expect(root.children.find((e) => e.tag === "desc")?.text).toMatch(/^Chart of the identified set/);
        expect(root.attrs.role).toBe("img");
      }
    }
  });

  test("draws one landmark symbol per reported landmark, each described for screen readers", async () => {
    for (const solution of [typicalSolution(), zeroMeanSolution()]) {
      const report = reportOf(solution);
      const root = parseSvg(await renderIdentifiedSetChart(report, variance));
      const symbols = markItems(root, "landmark-symbol");
      expect(symbols).toHaveLength(presentLandmarks(report));
      expect(symbols.every((s) => s.attrs["aria-roledescription"] === "landmark")).toBe(true);
      expect(descendants(root).filter((e) => e.attrs["aria-roledescription"] === "landmark")).toHaveLength(presentLandmarks(report));
    }
    expect(presentLandmarks(reportOf(zeroMeanSolution()))).toBe(4);
  });

  test("labels each landmark in plain words and draws the CAPM-consistent point larger and in bold", async () => {
    const root = parseSvg(await renderIdentifiedSetChart(reportOf(typicalSolution()), variance));
    const labels = markItems(root, "landmark-label");
    for (const name of landmarkNames) expect(labels.some((l) => l.text.startsWith(landmarkLabels[name]))).toBe(true);
    const capmLabel = labels.find((l) => l.text.startsWith(landmarkLabels.capmConsistent))!;
    expect(capmLabel.attrs["font-weight"]).toBe("bold");
    expect(labels.filter((l) => l.attrs["font-weight"] === "bold")).toHaveLength(1);
    const symbols = markItems(root, "landmark-symbol");
    const capm = symbols.find((s) => (s.attrs["aria-label"] ?? "").includes(`Landmark ${landmarkWords.capmConsistent}:`))!;
    const others = symbols.filter((s) => s !== capm).map((s) => symbolArea(s.attrs.d ?? ""));
    expect(others).toHaveLength(4);
    expect(Math.min(...others)).toBeGreaterThan(0);
    expect(symbolArea(capm.attrs.d ?? "")).toBeGreaterThan(1.5 * Math.max(...others));
  });

  test("titles the axes with the quantities and their units", async () => {
    const report = reportOf(typicalSolution());
    const v = texts(parseSvg(await renderIdentifiedSetChart(report, variance)));
    expect(v).toContain("low structural beta (b_low)");
    expect(v).toContain("noise variance per period (decimal units)");
    const s = texts(parseSvg(await renderIdentifiedSetChart(report, share)));
    expect(s).toContain("low structural beta (b_low)");
    expect(s).toContain("noise share s_low / (s_low + s_high)");
  });

  test("shades exactly the identified set: the range's pixel extent matches the bounds on the x axis", async () => {
    for (const [name, solution] of Object.entries(solvedFixtures())) {
      for (const options of [variance, share]) {
        const root = parseSvg(await renderIdentifiedSetChart(reportOf(solution), options));
        const x = xAxisScale(root);
        const [range] = markItems(root, "identified-set-range");
        const [left, right] = rectExtent(range!);
        const { min, max } = solution.bounds!.lowBeta;
        expect(Math.abs(left - x(min)), `${name} ${options.y} left`).toBeLessThanOrEqual(pixelTolerance);
        expect(Math.abs(right - x(max)), `${name} ${options.y} right`).toBeLessThanOrEqual(pixelTolerance);
      }
    }
  });

  test("draws the return-implied point outside the set at its b_low, inside the x axis, labelled outside the set", async () => {
    const solution = typicalSolution();
    const point = solution.landmarks!.returnImplied!;
    expect(point.insideSet).toBe(false);
    for (const options of [variance, share]) {
      const root = parseSvg(await renderIdentifiedSetChart(reportOf(solution), options));
      const symbol = markItems(root, "landmark-symbol").find((s) =>
        (s.attrs["aria-label"] ?? "").includes(`Landmark ${landmarkWords.returnImplied}:`),
      );
      expect(symbol?.attrs["aria-label"]).toContain("outside the identified set");
      const [px] = translation(symbol!);
      const x = xAxisScale(root);
      expect(Math.abs(px - x(point.lowBeta))).toBeLessThanOrEqual(pixelTolerance);
      const [plotLeft, plotRight] = rectExtent(
        descendants(root).find((e) => e.attrs.class === "background" && e.tag === "path" && /^M0,0h\d/.test(e.attrs.d ?? ""))!,
      );
      expect(px).toBeGreaterThan(plotLeft);
      expect(px).toBeLessThan(plotRight);
      const label = markItems(root, "landmark-label").find((l) => l.text.startsWith(landmarkLabels.returnImplied));
      expect(label?.text).toContain(outsideLabel);
      expect(outsideLabel).toBe("outside the set");
    }
  });

  test("continues both noise curves outside the set as dotted lines, the inside parts solid and dashed", async () => {
    const root = parseSvg(await renderIdentifiedSetChart(reportOf(typicalSolution()), variance));
    const dashOf = (name: string): string => markItems(root, name)[0]?.attrs["stroke-dasharray"] ?? "";
    expect(dashOf("curve-low-inside")).toBe("");
    expect(dashOf("curve-high-inside")).toBe("7,4");
    for (const side of ["below", "above"]) {
      expect(dashOf(`curve-low-outside-${side}`)).toBe("1.5,3");
      expect(dashOf(`curve-high-outside-${side}`)).toBe("1.5,3");
    }
    // Colour is never the only difference: the two curves differ in dash pattern and marker shape.
    const colours = ["curve-low-inside", "curve-high-inside"].map((n) => markItems(root, n)[0]?.attrs.stroke);
    expect(new Set(colours).size).toBe(2);
    const markerShapes = new Set(markItems(root, "grid-marker").map((m) => (m.attrs.d ?? "").replace(/[-\d.]+/g, "n")));
    expect(markerShapes.size).toBe(2);
  });

  test("the share chart has one curve and no noise-variance curves", async () => {
    const root = parseSvg(await renderIdentifiedSetChart(reportOf(typicalSolution()), share));
    expect(hasMark(root, "curve-share-inside")).toBe(true);
    expect(hasMark(root, "curve-low-inside")).toBe(false);
    expect(hasMark(root, "curve-high-inside")).toBe(false);
  });

  test("states the data range, the number of observations, the file, the assumptions and the caution", async () => {
    const report = reportOf(typicalSolution());
    const caption = texts(groupWithClass(parseSvg(await renderIdentifiedSetChart(report, variance)), "role-title-subtitle")).join(" ");
    expect(caption).toContain(report.input.source);
    expect(caption).toContain(`${report.input.firstDate} to ${report.input.lastDate}`);
    expect(caption).toContain(`${report.solution.observations} monthly observations`);
    expect(caption).toMatch(/Assumptions: one common factor/);
    expect(caption).toContain(cautionCaption);
    expect(cautionCaption).toMatch(/statistical estimates, not investment advice/);
  });

  test("is deterministic: the same report renders to identical SVG, also after rendering another chart", async () => {
    const report = reportOf(typicalSolution());
    const first = await renderIdentifiedSetChart(report, variance);
    await renderIdentifiedSetChart(reportOf(zeroMeanSolution()), share);
    const [second, third] = await Promise.all([renderIdentifiedSetChart(report, variance), renderIdentifiedSetChart(report, variance)]);
    expect(second).toBe(first);
    expect(third).toBe(first);
    expect(first).not.toMatch(/\sid="/);
  });

  test("draws interval bars for b_low and for both bounds when uncertainty is given, at their values", async () => {
    const solution = typicalSolution();
    const { min, max } = solution.bounds!.lowBeta;
    const w = max - min;
    const uncertainty = {
      lowBetaInterval: { lower: min - 0.3 * w, upper: max + 0.2 * w },
      boundIntervals: { min: { lower: min - 0.1 * w, upper: min + 0.1 * w }, max: { lower: max - 0.15 * w, upper: max + 0.1 * w } },
    };
    const root = parseSvg(await renderIdentifiedSetChart(reportOf(solution), { y: "variance", uncertainty }));
    const bars = markItems(root, "interval-bar");
    expect(bars).toHaveLength(3);
    const x = xAxisScale(root);
    const extents = bars.map((b) => {
      const [tx] = translation(b);
      return [tx, tx + Number(b.attrs.x2 ?? 0)] as const;
    });
    const expected = [uncertainty.boundIntervals.min, uncertainty.boundIntervals.max, uncertainty.lowBetaInterval];
    for (const [i, e] of expected.entries()) {
      expect(Math.abs(extents[i]![0] - x(e.lower))).toBeLessThanOrEqual(pixelTolerance);
      expect(Math.abs(extents[i]![1] - x(e.upper))).toBeLessThanOrEqual(pixelTolerance);
    }
    expect(hasMark(parseSvg(await renderIdentifiedSetChart(reportOf(solution), variance)), "interval-bar")).toBe(false);
  });

  test("escapes markup and neutralises control characters in names taken from the data", async () => {
    const report = reportOf(typicalSolution(), {
      source: 'evil"<file>.csv',
      lowColumn: "<script>alert(1)</script>",
      highColumn: "High & \u0007Beta",
    });
    const svg = await renderIdentifiedSetChart(report, variance);
    const root = parseSvg(svg);
    expect(svg).not.toContain("<script");
    expect(svg).not.toContain("\u0007");
    const caption = texts(root).join(" ");
    expect(caption).toContain('"<script>alert(1)</script>"');
    expect(caption).toContain("High & \\u{7}Beta");
    expect(caption).toContain('evil"<file>.csv');
  });

  test("says there is no identified set, instead of drawing one, when the model is rejected", async () => {
    const root = parseSvg(await renderIdentifiedSetChart(reportOf(rejectedSolution()), variance));
    const shown = texts(root);
    expect(shown).toContain("No identified set to draw");
    expect(shown.join(" ")).toContain("No one-factor structure fits these data: the covariance of low and high is");
    expect(hasMark(root, "identified-set-range")).toBe(false);
  });
});

describe("the sets under correlated noise (--noise-correlation)", () => {
  const rhos = [-0.5, 0, 0.3, 0.6, 0.95];
  function withSensitivity(): SolveReport {
    const s = typicalSolution();
    const m = {
      weight: s.weight,
      lowVariance: s.moments.low.variance,
      highVariance: s.moments.high.variance,
      covariance: s.moments.covariance.lowHigh,
    };
    return { ...reportOf(s), sensitivity: rhos.map((rho) => correlatedNoiseSet(m, rho, s.bounds)) };
  }

  test("draws one segment per rho with a set, from its lower to its upper low beta on the x axis", async () => {
    const report = withSensitivity();
    const root = parseSvg(await renderIdentifiedSetChart(report, variance));
    const x = xAxisScale(root);
    const withSet = report.sensitivity!.filter((e) => e.bounds.lowBeta.min !== null);
    // rho = 0.95 is above these books' correlation: no interval (docs/methods.md §2).
    expect(withSet.map((e) => e.noiseCorrelation)).toEqual([-0.5, 0, 0.3, 0.6]);
    const segments = markItems(root, "sensitivity-segments");
    expect(segments).toHaveLength(withSet.length);
    segments.forEach((segment, i) => {
      const [x0] = translation(segment);
      const x1 = x0 + Number(segment.attrs.x2);
      expect(Math.abs(x0 - x(withSet[i]!.bounds.lowBeta.min!))).toBeLessThan(pixelTolerance);
      expect(Math.abs(x1 - x(withSet[i]!.bounds.lowBeta.max!))).toBeLessThan(pixelTolerance);
      expect(segment.attrs["aria-label"]).toContain(`rho = ${withSet[i]!.noiseCorrelation}`);
    });
    // A wider set draws a longer segment: rho = 0.6 spans more than rho = 0.
    const length = (e: (typeof segments)[number]) => Math.abs(Number(e.attrs.x2));
    expect(length(segments[3]!)).toBeGreaterThan(length(segments[1]!));
  });

  test("labels every row with its rho, and says so where there is no interval", async () => {
    const root = parseSvg(await renderIdentifiedSetChart(withSensitivity(), variance));
    const labels = markItems(root, "sensitivity-labels").map((e) => e.text);
    expect(labels).toEqual(["rho = -0.5 (as uncorrelated)", "rho = 0 (as uncorrelated)", "rho = 0.3", "rho = 0.6"]);
    expect(markItems(root, "sensitivity-missing").map((e) => e.text)).toEqual([
      "rho = 0.95: no interval (rho at or above the books' correlation)",
    ]);
  });

  test("draws no strip without --noise-correlation", async () => {
    const root = parseSvg(await renderIdentifiedSetChart(reportOf(typicalSolution()), variance));
    expect(hasMark(root, "sensitivity-segments")).toBe(false);
    expect(hasMark(root, "sensitivity-heading")).toBe(false);
  });
});
