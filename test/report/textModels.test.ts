/** The text sections of the extensions (src/report/text/textModels.ts): present only when asked for, and their words. */
import { describe, expect, it } from "vitest";
import { identifiedBounds } from "../../src/core/identify.js";
import { correlatedNoiseSet } from "../../src/core/models/correlatedNoise.js";
import { solveIndex } from "../../src/core/models/indexSolve.js";
import { styleFor } from "../../src/report/layout.js";
import { modelSections } from "../../src/report/text/textModels.js";
import { renderText } from "../../src/report/text/text.js";
import { reportOf, typicalSolution } from "./fixtures.js";

const style = styleFor({ colour: false });
const options = { weight: 0.5, uncertainty: null, bootstrap: null, lowBetaBounds: null };
// Example A of docs/methods.md §1.7 (V_low 4, V_high 9, C 5), whose set under correlated noise is §2's table.
const exampleA = { weight: 0.5, lowMean: 0, highMean: 0, lowVariance: 4, highVariance: 9, covariance: 5 };

describe("the text sections of the index model and the sensitivity table", () => {
  it("are absent unless asked for", () => {
    expect(modelSections({ index: null, sensitivity: null }, style)).toEqual([]);
    const text = renderText(reportOf(typicalSolution()), { colour: false });
    expect(text).not.toContain("independent index");
    expect(text).not.toContain("Sensitivity to correlated noise");
  });

  it("say why an index gives no estimates, under the section", () => {
    const constant = solveIndex(
      { low: [0.01, 0.02, -0.01, 0.03], high: [0.02, 0.03, -0.02, 0.05], index: [0.01, 0.01, 0.01, 0.01] },
      options,
    );
    const [lines] = modelSections({ index: { column: "SPX", ...constant }, sensitivity: null }, style);
    expect(lines![0]).toBe('Model with an independent index (column "SPX")');
    expect(lines).toContain("  Not estimated:");
    expect(lines!.join("\n")).toContain("warning: the index series is constant");
  });

  it("show Example A's table (docs/methods.md §2) with a warning for each rho at or above the observed correlation", () => {
    const entries = [-0.5, 0.8, 0.9, 1].map((rho) => correlatedNoiseSet(exampleA, rho, identifiedBounds(exampleA)));
    const [lines] = modelSections({ index: null, sensitivity: entries }, style);
    const text = lines!.join("\n");
    expect(text).toMatch(/-0\.5\s+0\.71429\s+0\.88889\s+1\.1111\s+1\.2857\s+same as uncorrelated/);
    expect(text).toMatch(/0\.8\s+0\.61538\s+1\.0000\s+1\.0000\s+1\.3846\s+wider/);
    expect(text).toMatch(/0\.9\s+n\/a\s+n\/a\s+n\/a\s+n\/a\s+not an interval/);
    expect(text.match(/warning: an assumed noise correlation/g)).toHaveLength(2);
  });
});
