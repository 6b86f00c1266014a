/**
 * The k-portfolio chart (loadings against CAPM betas): on the committed factor-model fixture
 * (test/fixtures/factor-model, numpy/scipy), the points sit where the model's values put them on the
 * axes, the dashed line joins points whose two coordinates are equal, every portfolio is labelled and
 * every bar spans the loading +/- z standard errors.
 */
import { readFileSync } from "node:fs";
import { describe, expect, test } from "vitest";
import { type FactorModel, factorModelFromCovariance, sampleCovariance } from "../../../src/core/models/factorModel.js";
import { normalQuantile } from "../../../src/core/numerics/normal.js";
import {
  diagonalLabelAt,
  factorChartSpec,
  factorChartTitle,
  factorPoints,
  renderFactorChart,
} from "../../../src/report/charts/factorChart.js";
import { expectClose } from "../../support/close.js";
import { markItems, parseSvg, texts, translation, xAxisScale, yAxisScale } from "./svg.js";

interface Fixture {
  observations: number;
  weights: number[];
  columns: number[][];
  loadings: number[];
  capmBetas: number[];
  loadingStdErrors: number[];
}
const fixture = JSON.parse(readFileSync(new URL("../../fixtures/factor-model/factor_expected.json", import.meta.url), "utf8")) as Fixture;
const names = ["P1", "P2", "P3", "P4", "P5"];
const model = (): FactorModel =>
  factorModelFromCovariance(
    names,
    fixture.weights,
    sampleCovariance(fixture.columns.map((c) => Float64Array.from(c))),
    fixture.observations,
  );

/** Half a pixel of rounding either way, plus the half-pixel shift Vega gives axes. */
const pixelTolerance = 1;

describe("factorPoints", () => {
  test("holds each portfolio's CAPM beta and loading: scipy's fit of the fixture (generate_factor.py)", () => {
    const points = factorPoints(model());
    expect(points.map((p) => p.name)).toEqual(names);
    points.forEach((p, i) => {
      // The fixture's scipy optimiser stops at about 1e-8 (test/core/models/factorModel.test.ts).
      expectClose(p.loading, fixture.loadings[i]!, { rel: 1e-6 });
      expectClose(p.capmBeta, fixture.capmBetas[i]!, { rel: 1e-10 });
    });
  });

  test("bars span the loading +/- z standard errors at the level asked for (z the normal quantile)", () => {
    for (const confidence of [0.9, 0.95]) {
      const z = normalQuantile(0.5 + confidence / 2);
      factorPoints(model(), confidence).forEach((p, i) => {
        expectClose(p.upper! - p.loading, z * fixture.loadingStdErrors[i]!, { rel: 1e-5 });
        expectClose(p.loading - p.lower!, z * fixture.loadingStdErrors[i]!, { rel: 1e-5 });
      });
    }
  });

  test("leaves out portfolios without a loading and draws no bar without a standard error", () => {
    const m = model();
    const partial: FactorModel = {
      ...m,
      portfolios: m.portfolios.map((p, i) => (i === 0 ? { ...p, loading: null } : i === 1 ? { ...p, loadingStdError: null } : p)),
    };
    const points = factorPoints(partial);
    expect(points.map((p) => p.name)).toEqual(names.slice(1));
    expect(points[0]!.lower).toBeNull();
    expect(points[1]!.lower).not.toBeNull();
  });
});

describe("renderFactorChart", () => {
  test("puts every point at (CAPM beta, loading) on the axes, within a pixel", async () => {
    const m = model();
    const root = parseSvg(await renderFactorChart(m));
    const x = xAxisScale(root);
    const y = yAxisScale(root);
    const symbols = markItems(root, "portfolios");
    expect(symbols).toHaveLength(names.length);
    symbols.forEach((symbol, i) => {
      const [px, py] = translation(symbol);
      expect(Math.abs(px - x(m.portfolios[i]!.capmBeta!))).toBeLessThan(pixelTolerance);
      expect(Math.abs(py - y(m.portfolios[i]!.loading!))).toBeLessThan(pixelTolerance);
      expect(symbol.attrs["aria-label"]).toContain(`${names[i]}: loading`);
    });
  });

  test("draws the 45-degree line: both of its ends have equal x and y values, across the plot", async () => {
    const root = parseSvg(await renderFactorChart(model()));
    const x = xAxisScale(root);
    const y = yAxisScale(root);
    const [line] = markItems(root, "diagonal");
    const [x0, y0] = translation(line!);
    const x1 = x0 + Number(line!.attrs.x2);
    const y1 = y0 + Number(line!.attrs.y2);
    // Pixels back to values through each axis: the same value on both, at both ends.
    const value = (p: number, scale: (v: number) => number): number => {
      const a = scale(0);
      return (p - a) / (scale(1) - a);
    };
    expect(Math.abs(value(x0, x) - value(y0, y))).toBeLessThan(0.01);
    expect(Math.abs(value(x1, x) - value(y1, y))).toBeLessThan(0.01);
    expect(value(x1, x) - value(x0, x)).toBeGreaterThan(1); // spans the betas 0.53 to 1.41
    expect(texts(root)).toContain("loading = CAPM beta");
  });

  test("labels every point with its portfolio's name, beside it", async () => {
    const m = model();
    const root = parseSvg(await renderFactorChart(m));
    const labels = markItems(root, "portfolio-labels");
    expect(labels.map((l) => l.text)).toEqual(names);
    const symbols = markItems(root, "portfolios");
    labels.forEach((label, i) => {
      const [lx, ly] = translation(label);
      const [px, py] = translation(symbols[i]!);
      expect(Math.hypot(lx - px, ly - py)).toBeLessThan(20);
    });
  });

  test("draws each loading's bar from lower to upper end on the y axis", async () => {
    const m = model();
    const root = parseSvg(await renderFactorChart(m));
    const y = yAxisScale(root);
    const bars = markItems(root, "loading-intervals");
    const points = factorPoints(m);
    expect(bars).toHaveLength(points.length);
    bars.forEach((bar, i) => {
      const [, top] = translation(bar);
      expect(Math.abs(top - y(points[i]!.lower!))).toBeLessThan(pixelTolerance);
      expect(Math.abs(top + Number(bar.attrs.y2) - y(points[i]!.upper!))).toBeLessThan(pixelTolerance);
    });
  });

  test("carries a title, the fit statistic and a description naming every portfolio", async () => {
    const m = model();
    const root = parseSvg(await renderFactorChart(m));
    expect(root.children.find((e) => e.tag === "title")?.text).toBe(factorChartTitle);
    expect(root.children.find((e) => e.tag === "desc")?.text).toMatch(/P1: loading .*P5: loading/);
    expect(texts(root).join(" ")).toMatch(/chi-square .* on 5 df, p = /);
  });

  test("says there is nothing to draw when no loading was estimated", async () => {
    const m = model();
    const none: FactorModel = { ...m, portfolios: m.portfolios.map((p) => ({ ...p, loading: null })) };
    const root = parseSvg(await renderFactorChart(none));
    expect(root.children.find((e) => e.tag === "title")?.text).toBe("No factor model to draw");
  });
});

describe("diagonalLabelAt", () => {
  test("takes the middle of the widest gap between the CAPM betas (domain ends included)", () => {
    const points = [0.6, 0.7, 1.3].map((capmBeta) => ({
      name: "x",
      capmBeta,
      loading: capmBeta,
      lower: null,
      upper: null,
      description: "",
    }));
    expect(diagonalLabelAt(points, [0.5, 1.4])).toBeCloseTo(1.0, 12);
    expect(factorChartSpec(model()).marks?.map((mark) => mark.name)).toContain("diagonal-label");
  });
});
