/**
 * Writes desk-a.csv and desk-b.csv: Harbourline Capital's two desks (an invented scenario), each
 * running its own sleeve of the firm's three strategies, exported monthly in percent with the cash
 * rate beside them. One latent factor drives all three books (the model betabound assumes), with
 * the structure below; each desk draws its own factor path and noises from its own seed.
 *
 * Run from the repository root after `npm run build`: node examples/desks/generate.mjs
 */
import { writeFileSync } from "node:fs";
import { createRandom, periodDates } from "../../dist/core.js";

const months = 180;
const start = "2011-01-01";
/** Structural betas and noise standard deviations per month (decimal). */
const books = [
  { name: "Stillwater Low Vol", beta: 0.72, noise: 0.014 },
  { name: "Tidewater Low Vol", beta: 0.86, noise: 0.012 },
  { name: "Kestrel High Beta", beta: 1.28, noise: 0.022 },
];
const factor = { mean: 0.006, sd: 0.045 };

/** The cash rate in % a month: 0.05 until 2016, rising by 0.01 a month to 0.35, then held. */
const cashRate = (i) => Math.min(0.35, 0.05 + Math.max(0, i - 60) * 0.01);

function desk(seed) {
  const random = createRandom(seed);
  const dates = periodDates("monthly", start, months);
  const lines = [["Month End", ...books.map((b) => b.name), "Cash Rate"].join(",")];
  for (const [i, date] of dates.entries()) {
    const rf = cashRate(i);
    const f = factor.mean + factor.sd * random.normal();
    const returns = books.map((b) => (100 * (b.beta * f + b.noise * random.normal()) + rf).toFixed(3));
    lines.push([date, ...returns, rf.toFixed(2)].join(","));
  }
  return `${lines.join("\n")}\n`;
}

writeFileSync(new URL("desk-a.csv", import.meta.url), desk(2101));
writeFileSync(new URL("desk-b.csv", import.meta.url), desk(2102));
