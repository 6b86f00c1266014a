// bench/RESULTS.md from the measured cases.
import { ratioText, seconds } from "./check.mjs";

const mb = (x) => (x == null ? "-" : x.toFixed(0));

export function renderResults({ summary, full, machine, root, cacheDir, analysis }) {
  const shown = (argv) =>
    argv
      .map((a, i) => {
        if (i === 0 && a === process.execPath) return "node";
        if (a.startsWith(cacheDir)) return a.replace(cacheDir, "$CACHE");
        if (a.startsWith(root)) return a.slice(root.length);
        if (a.startsWith("{")) return `'${a.replaceAll(cacheDir, "$CACHE")}'`;
        return /[\s,]/.test(a) && a.length < 200 ? `"${a}"` : a;
      })
      .join(" ");
  const load = (l) => l.map((x) => x.toFixed(2)).join(", ");
  const peerLine = Object.entries(machine.peers)
    .map(([name, p]) => (p.version ? `${name} ${p.version}` : `${name} MISSING (${p.missing})`))
    .join(", ");
  let md = "# Benchmarks\n\n";
  md += "Written by `npm run bench` (bench/run.mjs); do not edit by hand (bench/analysis.md is appended as it is).\n\n";
  if (!full) md += `**Partial run** (a subset of cases or rows scaled by ${machine.rowsScale}): not the published figures.\n\n`;
  md += `- Machine: ${machine.cpu}, ${machine.cores} cores, ${machine.memoryGiB.toFixed(1)} GiB memory, ${machine.os}\n`;
  md += `- Node ${machine.node}; Python ${machine.python}; ${peerLine}\n`;
  md += `- Date: ${machine.date}\n`;
  md += `- Load average (1, 5, 15 min) at the start: ${load(machine.loadAtStart)}; at the end: ${load(machine.loadAtEnd)}. The machine is shared: other work ran beside the benchmark, and the peers' and our times include its noise alike (the rounds are interleaved).\n`;
  md += `- Method: per case one untimed warm-up of every side (its output is what the agreement check reads), then paired rounds: every side once per round, the order rotated between rounds; the figure is the median wall time of the whole process (interpreter start-up, reading the file, the job, writing the output file), min-max in brackets. Peak memory: ${machine.memorySource}, the largest over the rounds. Python is run as the interpreter itself (\`sys.executable\`), never through a version-manager shim. Threads: every side with its defaults (polars and DuckDB use both cores; numpy's BLAS may), and ours also with \`--threads 1\` where the option applies (the bootstrap).\n`;
  md +=
    "- Floors measured in the same rounds: `node -e 0` (node's start-up), `python -c pass` (the interpreter's), `cat FILE > /dev/null` (the file's bytes from the page cache) and `wc -l FILE` (a native pass over the bytes).\n";
  const touch = machine.pageTouch;
  const range = (l) => (l.length === 0 ? "not measured" : `${Math.min(...l).toFixed(1)}-${Math.max(...l).toFixed(1)}`);
  if (touch)
    md += `- First touch of fresh memory (bench/lib/pageTouch.mjs: a new 64 MiB array written once a 4 KiB page, five runs at the start and five at the end): ${touch.median.toFixed(1)} microseconds a page fault (${range(touch.atStart)} at the start, ${range(touch.atEnd)} at the end).\n`;
  md += "- Ratios: our median over the best peer's median and over numpy's (below 1: we are faster).\n\n";
  md +=
    "| case | ours s | numpy s | polars s | DuckDB s | ours / best peer | ours / numpy | peak MB: ours / numpy / polars / DuckDB | floors s: node, python, cat, wc -l |\n";
  md += "|---|---|---|---|---|---|---|---|---|\n";
  for (const r of summary) {
    const cell = (name) => {
      if (r.missing[name]) return "missing";
      const s = r.stats[name];
      return s ? `${seconds(s.median)} (${seconds(s.min)}-${seconds(s.max)})` : "n/a";
    };
    const variants = r.sides.filter((s) => s.role === "variant").map((s) => `; ${s.name}: ${seconds(r.stats[s.name].median)}`);
    const memory = ["ours", "numpy", "polars", "duckdb"].map((n) => (r.stats[n] ? mb(r.stats[n].rssMb) : "-")).join(" / ");
    const floors = ["node -e 0", "python -c pass", "cat FILE", "wc -l FILE"].map((n) => seconds(r.stats[n].median)).join(", ");
    const best = r.best ? `${ratioText(r.ratioBest)} (${r.best.name})` : "-";
    md += `| (${r.case.id}) ${r.case.title} | ${cell("ours")}${variants.join("")} | ${cell("numpy")} | ${cell("polars")} | ${cell("duckdb")} | ${best} | ${ratioText(r.ratioNumpy)} | ${memory} | ${floors} |\n`;
  }
  const scaling = summary.filter((r) => r.case.scaling && r.stats["ours, 300 rows"]).sort((a, b) => a.data.rows - b.data.rows);
  if (scaling.length > 0) {
    const perRow = (r) => (r.stats.ours.median - r.stats["ours, 300 rows"].median) / (r.data.rows - 300);
    const million = scaling.find((r) => r.data.rows === 1_000_000) ?? scaling.at(-1);
    md += "\n## Time per row at default settings\n\n";
    md +=
      "Our median less the median of the same command on the first 300 rows of the same data (the fixed cost: start-up, reading the options, writing; timed in the same rounds), over the extra rows. Linear scaling keeps the column against 1,000,000 rows near 1.\n\n";
    md +=
      "Page faults: the median count of the rounds (/usr/bin/time's %R, threads and child processes included) less that of the 300-row run, per extra row, and what they cost at the first touch measured above. That is processor time on whichever thread took them: from 1 MiB arrays on, a worker thread takes many of them beside the main one, so the wall pays less; from 128 MiB of input, runs use huge pages (fewer faults, each dearer).\n\n";
    md +=
      "| case | rows | ours s | ours on 300 rows s | microseconds per row | against 1,000,000 rows | page faults per 1,000 extra rows | their cost, microseconds per row | peak MB |\n|---|---|---|---|---|---|---|---|---|\n";
    const faultsPerRow = (r) => {
      const [all, tiny] = [r.stats.ours.faults, r.stats["ours, 300 rows"].faults];
      return all === null || tiny === null ? null : (all - tiny) / (r.data.rows - 300);
    };
    for (const r of scaling) {
      const us = perRow(r) * 1e6;
      const faults = faultsPerRow(r);
      const faultCells = faults === null ? "- | -" : `${(faults * 1000).toFixed(1)} | ${touch ? (faults * touch.median).toFixed(3) : "-"}`;
      md += `| (${r.case.id}) | ${r.data.rows.toLocaleString("en-US")} | ${seconds(r.stats.ours.median)} | ${seconds(r.stats["ours, 300 rows"].median)} | ${us.toFixed(3)} | ${(perRow(r) / perRow(million)).toFixed(2)} | ${faultCells} | ${mb(r.stats.ours.rssMb)} |\n`;
    }
    md += segmentTable(scaling);
  }
  md += "\n## Cases: commands, agreement, every round\n\n";
  md +=
    "Data are generated by bench/lib/data.mjs (seeded, one-factor model, 9 decimals) into the cache folder ($CACHE, bench/.cache by default, ignored by git) and reused. Peers write a digest of the numbers (JSON, by the JSON path of ours: moments, bounds, both CAPM fits, every candidate-grid point and landmark, the default uncertainty and the pricing section) or the roll CSV with our column names; the check aligns pairs by their column names and windows row by row with their start and end dates, columns by name. Tolerances: bench/lib/cases.mjs.\n\n";
  for (const r of summary) {
    md += `### (${r.case.id}) ${r.case.title}\n\n`;
    md += `- Data: ${r.data.description}; ${r.data.rows.toLocaleString("en-US")} rows, ${(r.data.bytes / 2 ** 20).toFixed(1)} MiB. ${r.rounds} rounds.\n`;
    for (const side of r.sides.filter((s) => s.role !== "floor")) md += `- ${side.name}: \`${shown(side.argv)}\`\n`;
    for (const [peer, why] of Object.entries(r.missing)) md += `- ${peer}: MISSING (${why}): not measured\n`;
    if (r.case.peerNote) md += `- ${r.case.peerNote}\n`;
    for (const [name, check] of Object.entries(r.checks)) {
      md += `- Agreement with ${name}: ${check.compared} ${r.case.kind === "roll" ? "windows" : "numbers"} compared, largest relative difference ${check.worst.toExponential(1)} (${check.worstPath})\n`;
    }
    md += `- Seconds per round: ${r.sides.map((s) => `${s.name} ${r.stats[s.name].all.map((x) => x.toFixed(3)).join(", ")}`).join("; ")}\n\n`;
  }
  if (analysis) md += `\n${analysis}`;
  return md;
}

/**
 * The time per row from one size to the next (the difference of the medians over the difference of
 * the rows), ours and every peer's: no fixed cost to subtract, so the peers, which have no 300-row run,
 * are shown alike. The spread is each side's largest over its smallest.
 */
function segmentTable(scaling) {
  if (scaling.length < 2) return "";
  const sides = ["ours", "numpy", "polars", "duckdb"].filter((name) => scaling.every((r) => r.stats[name]));
  const segments = scaling.slice(1).map((r, i) => {
    const from = scaling[i];
    const us = (name) => ((r.stats[name].median - from.stats[name].median) / (r.data.rows - from.data.rows)) * 1e6;
    return { from, to: r, us: Object.fromEntries(sides.map((name) => [name, us(name)])) };
  });
  const minutes = scaling.some((r) => r.data.rows >= 10_000_000)
    ? " (the 10,000,000-row case reads minute stamps, the others daily dates: data.mjs)"
    : "";
  let md = `\nFrom one size to the next: the difference of the medians over the difference of the rows, microseconds a row${minutes}.\n\n`;
  const shownName = { ours: "ours", numpy: "numpy", polars: "polars", duckdb: "DuckDB" };
  md += `| rows | ${sides.map((name) => shownName[name]).join(" | ")} |\n|---|${sides.map(() => "---|").join("")}\n`;
  for (const s of segments) {
    const rows = `${s.from.data.rows.toLocaleString("en-US")} to ${s.to.data.rows.toLocaleString("en-US")}`;
    md += `| ${rows} | ${sides.map((name) => s.us[name].toFixed(3)).join(" | ")} |\n`;
  }
  const spread = (name) => {
    const values = segments.map((s) => s.us[name]);
    return Math.min(...values) > 0 ? `${(Math.max(...values) / Math.min(...values)).toFixed(2)}x` : "-";
  };
  if (segments.length >= 2) md += `| largest over smallest | ${sides.map(spread).join(" | ")} |\n`;
  return md;
}
