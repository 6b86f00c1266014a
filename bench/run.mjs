// Runs every benchmark (ours vs a numpy peer) and writes bench/RESULTS.md.
// Usage: npm run bench  [-- --rounds N]   (builds dist/ first when it is missing)
// Each case: one untimed warm-up of each side, then N paired rounds (ours and the peer interleaved,
// the order alternating between rounds); wall time of the whole process (start-up included) and peak
// RSS from /usr/bin/time (%M) when present, else from a wrapper reading process.resourceUsage().
// Data files are generated into a temporary folder with `node dist/cli.cjs simulate` and removed after.
import { execFileSync, spawnSync } from "node:child_process";
import {
  existsSync,
  mkdtempSync,
  openSync,
  closeSync,
  fstatSync,
  readFileSync,
  readSync,
  rmSync,
  writeFileSync,
  createWriteStream,
} from "node:fs";
import { cpus, tmpdir, totalmem, platform, release } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { once } from "node:events";

const root = fileURLToPath(new URL("..", import.meta.url));
const benchDir = join(root, "bench");
const roundsArg = process.argv.indexOf("--rounds");
const rounds = roundsArg > 0 ? Number(process.argv[roundsArg + 1]) : 7;
const cli = join(root, "dist", "cli.cjs");
if (!existsSync(cli)) execFileSync("npm", ["run", "build"], { cwd: root, stdio: "inherit" });
const tmp = mkdtempSync(join(tmpdir(), "betabound-bench-"));
const log = (message) => process.stderr.write(`${message}\n`);
const hasTime = existsSync("/usr/bin/time");

// ---- data ------------------------------------------------------------------------------------
const simulateArgs = [
  "--low-beta",
  "0.7",
  "--factor-vol",
  "0.01",
  "--factor-mean",
  "0.0004",
  "--low-noise-vol",
  "0.004",
  "--high-noise-vol",
  "0.006",
  "--frequency",
  "daily",
];
const dailyFile = join(tmp, "daily-2520.csv");
execFileSync(process.execPath, [cli, "simulate", ...simulateArgs, "--periods", "2520", "--seed", "1", "--output", dailyFile]);
const bigFile = join(tmp, "daily-1m.csv");
{
  const raw = join(tmp, "raw-1m.csv");
  execFileSync(process.execPath, [
    cli,
    "simulate",
    ...simulateArgs,
    "--periods",
    "1000000",
    "--seed",
    "2",
    "--digits",
    "9",
    "--output",
    raw,
  ]);
  // Add a risk-free column and a fourth numeric column (a third return series), streamed.
  const lines = readFileSync(raw, "utf8").split("\n");
  const out = createWriteStream(bigFile);
  let chunk = "date,low,high,rf,other\n";
  for (let t = 1; t < lines.length; t++) {
    const line = lines[t];
    if (line === "") continue;
    const i = t - 1;
    const rf = (0.00008 + 0.00004 * Math.sin(i / 500)).toFixed(9);
    const other = (0.0003 + 0.012 * Math.sin(i * 12.9898) * Math.cos(i * 78.233)).toFixed(9);
    chunk += `${line},${rf},${other}\n`;
    if (chunk.length > 1 << 20) {
      if (!out.write(chunk)) await once(out, "drain");
      chunk = "";
    }
  }
  out.end(chunk);
  await once(out, "finish");
  rmSync(raw);
}
const fileSize = (path) => readFileSync(path).length;
const sizes = { daily: fileSize(dailyFile), big: fileSize(bigFile) };

// ---- entries bundled on the fly ----------------------------------------------------------------
const { build } = await import("esbuild");
async function bundle(entry, outName) {
  const outfile = join(tmp, outName);
  try {
    await build({
      entryPoints: [join(benchDir, entry)],
      outfile,
      bundle: true,
      platform: "node",
      format: "esm",
      target: "node20",
      logLevel: "silent",
    });
    return { ok: true, outfile };
  } catch (error) {
    return {
      ok: false,
      reason: String(error?.message ?? error)
        .split("\n")
        .slice(0, 3)
        .join(" "),
    };
  }
}
const bootstrapEntry = await bundle("bootstrap-case.ts", "bootstrap-case.mjs");

// ---- measurement ---------------------------------------------------------------------------------
const rssWrapper = join(tmp, "rss.mjs");
writeFileSync(
  rssWrapper,
  `import { spawnSync } from "node:child_process";
const [cmd, ...args] = process.argv.slice(2);
const r = spawnSync(cmd, args, { stdio: "inherit" });
process.stderr.write("\\nRSS_KB " + process.resourceUsage().maxRSS + "\\n");
process.exit(r.status ?? 1);
`,
);
/** Runs argv with stdout to a file; returns wall seconds, peak RSS (MB) and the output path. */
function measure(argv, outPath) {
  const fd = openSync(outPath, "w");
  const wrapped = hasTime ? ["/usr/bin/time", ["-f", "RSS_KB %M", ...argv]] : [process.execPath, [rssWrapper, ...argv]];
  const started = process.hrtime.bigint();
  const result = spawnSync(wrapped[0], wrapped[1], { stdio: ["ignore", fd, "pipe"], encoding: "utf8", maxBuffer: 1 << 26 });
  const seconds = Number(process.hrtime.bigint() - started) / 1e9;
  closeSync(fd);
  if (result.status !== 0) throw new Error(`${argv.join(" ")} failed (${result.status}): ${result.stderr.slice(-2000)}`);
  const rss = /RSS_KB (\d+)/.exec(result.stderr);
  return { seconds, rssMb: rss ? Number(rss[1]) / 1024 : null };
}
const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

const python = "python3";
const cases = [
  {
    id: "a",
    title: "solve, 2,520 daily rows, JSON",
    target: { ratio: 0.6 },
    ours: [process.execPath, cli, "solve", dailyFile, "--low", "low", "--high", "high", "--format", "json", "--no-uncertainty"],
    peer: [python, join(benchDir, "peer_solve.py"), dailyFile, "low", "high"],
    check: (o, p) => compareBounds(readJson(o), readJson(p)),
    note: "both sides do the same job: moments, CAPM fits with classical errors, bounds, grid; the peer computes no HAC or delta-method errors, so ours runs with --no-uncertainty (case a2 shows the default run)",
  },
  {
    id: "a2",
    title: "solve, 2,520 daily rows, JSON, with the default uncertainty (HAC, delta method, intervals)",
    target: null,
    ours: [process.execPath, cli, "solve", dailyFile, "--low", "low", "--high", "high", "--format", "json"],
    peer: [python, join(benchDir, "peer_solve.py"), dailyFile, "low", "high"],
    check: (o, p) => compareBounds(readJson(o), readJson(p)),
    note: "for reference only: ours does more work than the peer here",
  },
  {
    id: "b",
    title: "solve, 1,000,000 daily rows (date + 4 numeric columns), JSON",
    target: { ratio: 0.67, rssMb: 250 },
    ours: [process.execPath, cli, "solve", bigFile, "--low", "low", "--high", "high", "--rf", "rf", "--format", "json", "--no-uncertainty"],
    note: "the same job on both sides (no HAC on either); with the default uncertainty ours adds the HAC passes",
    peer: [python, join(benchDir, "peer_solve.py"), bigFile, "low", "high", "rf"],
    check: (o, p) => compareBounds(readJson(o), readJson(p)),
  },
  bootstrapEntry.ok
    ? {
        id: "c",
        title: "stationary bootstrap, B = 10,000, n = 2,520, mean block length 10",
        target: { ratio: 0.3 },
        ours: [process.execPath, bootstrapEntry.outfile, dailyFile, "low", "high", "10000", "10", "1"],
        peer: [python, join(benchDir, "peer_bootstrap.py"), dailyFile, "low", "high", "10000", "10", "1"],
        check: (o, p) => {
          const a = readJson(o).stdErrors.lowBetaMin;
          const b = readJson(p).stdErrors.lowBetaMin;
          return `bootstrap SE of the lower low-beta bound: ours ${a.toPrecision(4)}, numpy ${b.toPrecision(4)} (different generators: Monte Carlo agreement only)`;
        },
      }
    : {
        id: "c",
        title: "stationary bootstrap, B = 10,000, n = 2,520",
        skipped: `src/core/inference bootstrap did not build: ${bootstrapEntry.reason}`,
      },
  {
    id: "d",
    title: "rolling window 252 over 1,000,000 rows, CSV of every window",
    target: { ratio: 0.7 },
    ours: [process.execPath, cli, "roll", bigFile, "--low", "low", "--high", "high", "--window", "252", "--format", "csv"],
    peer: [python, join(benchDir, "peer_roll.py"), bigFile, "low", "high", "252"],
    check: (o, p) => compareRoll(o, p),
    note: "ours: the CLI's roll command",
  },
];

function pick(report) {
  return report.bounds ?? report.solution?.bounds ?? report.results?.[0]?.bounds;
}
function compareBounds(ours, peer) {
  const a = pick(ours);
  const b = peer.bounds;
  if (!a) return "ours: bounds not found in the JSON";
  const rel = Math.max(Math.abs(a.lowBeta.min - b.lowBeta.min) / b.lowBeta.min, Math.abs(a.lowBeta.max - b.lowBeta.max) / b.lowBeta.max);
  return `low-beta bounds [${a.lowBeta.min.toPrecision(8)}, ${a.lowBeta.max.toPrecision(8)}]; largest relative difference from numpy ${rel.toExponential(1)}`;
}
const readJson = (path) => JSON.parse(readFileSync(path, "utf8"));
/** The header, first data line, a middle line and the last line of a (possibly huge) CSV output, and its line count. */
function sampleLines(path) {
  const fd = openSync(path, "r");
  const size = fstatSync(fd).size;
  const read = (position, length) => {
    const buffer = Buffer.alloc(Math.min(length, size - position));
    readSync(fd, buffer, 0, buffer.length, position);
    return buffer.toString("utf8");
  };
  const head = read(0, 1 << 16).split("\n");
  const middle = read(Math.floor(size / 2), 1 << 16).split("\n")[1];
  const tail = read(Math.max(0, size - (1 << 16)), 1 << 16)
    .trimEnd()
    .split("\n")
    .at(-1);
  let lines = 0;
  const buffer = Buffer.alloc(1 << 24);
  for (let position = 0; position < size; position += buffer.length) {
    const n = readSync(fd, buffer, 0, buffer.length, position);
    for (let i = 0; i < n; i++) if (buffer[i] === 10) lines++;
  }
  closeSync(fd);
  return { first: head[1], middle, last: tail, windows: lines - 1 };
}
function compareRoll(oPath, pPath) {
  const a = sampleLines(oPath);
  const b = sampleLines(pPath);
  let worst = 0;
  for (const key of ["first", "last"]) {
    const x = a[key].split(",");
    const y = b[key].split(",");
    for (let j = 3; j < 33; j++) {
      if (x[j] === "" && y[j] === "nan") continue;
      const u = Number(x[j]);
      const v = Number(y[j]);
      worst = Math.max(worst, Math.abs(u - v) / Math.max(Math.abs(v), 1e-300));
    }
  }
  return `${a.windows} windows (numpy ${b.windows}); largest relative difference over columns 4-33 of the first and last window: ${worst.toExponential(1)} (numpy's cumulative sums lose digits in the moments)`;
}

const results = [];
for (const c of cases) {
  if (c.skipped || c.ours === null) {
    results.push({ ...c, skipped: c.skipped ?? "no entry for ours" });
    log(`(${c.id}) skipped: ${c.skipped}`);
    continue;
  }
  log(`(${c.id}) ${c.title}`);
  const oursOut = join(tmp, `${c.id}-ours.out`);
  const peerOut = join(tmp, `${c.id}-peer.out`);
  measure(c.ours, oursOut);
  measure(c.peer, peerOut);
  const agreement = c.check(oursOut, peerOut);
  const ours = [];
  const peer = [];
  for (let r = 0; r < rounds; r++) {
    const order = r % 2 === 0 ? ["ours", "peer"] : ["peer", "ours"];
    for (const side of order) {
      const m = side === "ours" ? measure(c.ours, oursOut) : measure(c.peer, peerOut);
      (side === "ours" ? ours : peer).push(m);
    }
    log(`  round ${r + 1}: ours ${ours.at(-1).seconds.toFixed(3)} s, numpy ${peer.at(-1).seconds.toFixed(3)} s`);
  }
  results.push({ ...c, oursRuns: ours, peerRuns: peer, agreement });
}
rmSync(tmp, { recursive: true, force: true });

// ---- report ------------------------------------------------------------------------------------
const pythonVersion = spawnSync(python, ["-c", "import sys, numpy; print(sys.version.split()[0], numpy.__version__)"], { encoding: "utf8" })
  .stdout.trim()
  .split(" ");
const fmtS = (x) => x.toFixed(3);
const stats = (ms) => {
  const s = ms.map((m) => m.seconds);
  return { median: median(s), min: Math.min(...s), max: Math.max(...s), rss: Math.max(...ms.map((m) => m.rssMb ?? 0)) };
};
const display = (argv) =>
  argv
    .map((a) =>
      a === process.execPath ? "node" : a.startsWith(tmp) ? a.replace(tmp, "$TMP") : a.startsWith(root) ? a.slice(root.length) : a,
    )
    .join(" ");
let md = `# Benchmarks\n\nWritten by \`npm run bench\` (bench/run.mjs); do not edit by hand (bench/analysis.md is appended as it is).\n\n`;
md += `- Machine: ${cpus()[0]?.model ?? "unknown"}, ${cpus().length} cores, ${(totalmem() / 2 ** 30).toFixed(1)} GiB memory, ${platform()} ${release()}\n`;
md += `- Node ${process.version}; Python ${pythonVersion[0]}, numpy ${pythonVersion[1]}\n`;
md += `- Date: ${new Date().toISOString()}\n`;
md += `- Method: one untimed warm-up per side, then ${rounds} paired rounds (ours and numpy interleaved, order alternating); wall time of the whole process including interpreter start-up, output to a file; peak RSS by ${hasTime ? "/usr/bin/time -f %M" : "process.resourceUsage().maxRSS in a wrapper"}.\n`;
md += `- Data: generated per run with \`node dist/cli.cjs simulate ${simulateArgs.join(" ")}\` (2,520 rows, seed 1, full precision, ${(sizes.daily / 1024).toFixed(0)} KiB; 1,000,000 rows, ${(sizes.big / 2 ** 20).toFixed(1)} MiB, seed 2, --digits 9, plus rf and a fourth numeric column).\n\n`;
md += `| case | ours median (min-max) s | numpy median (min-max) s | ratio ours/numpy | target | peak RSS ours / numpy MB | met |\n|---|---|---|---|---|---|---|\n`;
for (const r of results) {
  if (r.skipped) {
    md += `| (${r.id}) ${r.title} | skipped | | | | | ${r.skipped} |\n`;
    continue;
  }
  const o = stats(r.oursRuns);
  const p = stats(r.peerRuns);
  const ratio = o.median / p.median;
  const met = r.target === null ? null : ratio <= r.target.ratio && (r.target.rssMb === undefined || o.rss < r.target.rssMb);
  const target = r.target === null ? "(reference)" : `<= ${r.target.ratio}${r.target.rssMb ? `, RSS < ${r.target.rssMb} MB` : ""}`;
  md += `| (${r.id}) ${r.title} | ${fmtS(o.median)} (${fmtS(o.min)}-${fmtS(o.max)}) | ${fmtS(p.median)} (${fmtS(p.min)}-${fmtS(p.max)}) | ${ratio.toFixed(2)} | ${target} | ${o.rss.toFixed(0)} / ${p.rss.toFixed(0)} | ${met === null ? "-" : met ? "yes" : "**no**"} |\n`;
}
md += `\n## Commands and checks\n\n`;
for (const r of results) {
  md += `### (${r.id}) ${r.title}\n\n`;
  if (r.skipped) {
    md += `Skipped: ${r.skipped}\n\n`;
    continue;
  }
  md += `- ours: \`${display(r.ours)}\`\n- numpy: \`${display(r.peer)}\`\n`;
  if (r.note) md += `- ${r.note}\n`;
  md += `- outputs: ${r.agreement}\n`;
  md += `- ours, s: ${r.oursRuns.map((m) => fmtS(m.seconds)).join(", ")}; numpy, s: ${r.peerRuns.map((m) => fmtS(m.seconds)).join(", ")}\n\n`;
}
const analysis = join(benchDir, "analysis.md");
if (existsSync(analysis)) md += `\n${readFileSync(analysis, "utf8")}`;
writeFileSync(join(benchDir, "RESULTS.md"), md);
log("wrote bench/RESULTS.md");
