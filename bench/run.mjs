// The benchmark: each case runs the CLI as a user does (node dist/cli.cjs ... --output FILE) beside
// peers in Python (numpy, polars, DuckDB) doing the same job, checks that the outputs agree, and
// times paired, interleaved rounds. Writes bench/RESULTS.md after a full run (every case, full size).
//
//   npm run bench                                  every case, default rounds (the 10M cases take minutes)
//   npm run bench -- --cases a1,a2 --rounds 3      a subset, fewer rounds (results printed, RESULTS.md kept)
//   npm run bench -- --rows-scale 0.01             smaller data, for a quick check of the machinery
//
// Environment: BETABOUND_BENCH_PYTHON (the interpreter, default python3; resolved once to
// sys.executable so that no version-manager shim is timed), BETABOUND_BENCH_CACHE (data folder,
// default bench/.cache, ignored by git).
import { execFileSync, spawnSync } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { cpus, loadavg, platform, release, totalmem } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { bestPeer, compareDigest, median, ratio, rollComparer } from "./lib/check.mjs";
import { buildCases, rollTolerance, solveTolerance } from "./lib/cases.mjs";
import { dataFile } from "./lib/data.mjs";
import { fileLines, measure, memorySource, readJson } from "./lib/measure.mjs";
import { renderResults } from "./lib/report.mjs";

const root = fileURLToPath(new URL("..", import.meta.url));
const log = (message) => process.stderr.write(`${message}\n`);
const argValue = (name) => {
  const i = process.argv.indexOf(name);
  return i > 0 ? process.argv[i + 1] : undefined;
};
const selected = argValue("--cases")?.split(",");
const roundsOverride = argValue("--rounds") === undefined ? null : Number(argValue("--rounds"));
const rowsScale = Number(argValue("--rows-scale") ?? 1);
const cacheDir = process.env.BETABOUND_BENCH_CACHE ?? join(root, "bench", ".cache");
const outDir = join(cacheDir, "outputs");
mkdirSync(outDir, { recursive: true });

const cli = join(root, "dist", "cli.cjs");
if (!existsSync(cli)) execFileSync("npm", ["run", "build"], { cwd: root, stdio: "inherit" });

// ---- the interpreter and the peers -------------------------------------------------------------
const configuredPython = process.env.BETABOUND_BENCH_PYTHON ?? "python3";
const probe = spawnSync(configuredPython, ["-c", "import sys; print(sys.executable); print(sys.version.split()[0])"], { encoding: "utf8" });
if (probe.status !== 0) {
  log(`bench: cannot run ${configuredPython} (${probe.error?.message ?? probe.stderr.trim()}); set BETABOUND_BENCH_PYTHON`);
  process.exit(1);
}
const [python, pythonVersion] = probe.stdout.trim().split("\n");
const peerModules = { numpy: "numpy", polars: "polars", duckdb: "duckdb" };
const peerVersions = {};
for (const [peer, module] of Object.entries(peerModules)) {
  const r = spawnSync(python, ["-c", `import ${module}; print(${module}.__version__)`], { encoding: "utf8" });
  peerVersions[peer] = r.status === 0 ? { version: r.stdout.trim() } : { missing: r.stderr.trim().split("\n").at(-1) || "not importable" };
}
if (peerVersions.numpy.missing) log(`bench: numpy is missing under ${python}: every peer needs it (${peerVersions.numpy.missing})`);
const available = (peer) => peerVersions.numpy.version !== undefined && peerVersions[peer].version !== undefined;

// ---- cases -------------------------------------------------------------------------------------
const allCases = buildCases();
const cases = selected ? allCases.filter((c) => selected.includes(c.id)) : allCases;
if (selected && cases.length !== selected.length) {
  log(`bench: unknown case in --cases ${selected.join(",")}; cases are ${allCases.map((c) => c.id).join(", ")}`);
  process.exit(1);
}
const defaultRounds = (c) => (c.data === "minutes10m" || c.data === "daily10m" || c.kind === "roll" ? 3 : c.data === "daily1m" ? 7 : 9);
const loadAtStart = loadavg();
/**
 * The first touch of fresh memory (bench/lib/pageTouch.mjs): microseconds per 4 KiB page fault, five
 * runs; those that fail or count no fault are left out (logged), never the run's results.
 */
const pageTouch = () =>
  Array.from({ length: 5 }, () => {
    try {
      const probe = JSON.parse(execFileSync(process.execPath, [join(root, "bench", "lib", "pageTouch.mjs")], { encoding: "utf8" }));
      if (probe.faults > 0 && Number.isFinite(probe.usPerFault)) return probe.usPerFault;
      log(`bench: the first-touch probe counted no page fault (${JSON.stringify(probe)}): left out`);
    } catch (error) {
      log(`bench: the first-touch probe failed (${error.message.split("\n")[0]}): left out`);
    }
    return null;
  }).filter((x) => x !== null);
const pageTouchAtStart = pageTouch();
const results = [];
for (const c of cases) {
  const data = dataFile(cacheDir, c.data, rowsScale, log);
  const rounds = roundsOverride ?? defaultRounds(c);
  log(`(${c.id}) ${c.title}: ${data.rows} rows, ${(data.bytes / 2 ** 20).toFixed(1)} MiB, ${rounds} rounds`);
  const ext = c.kind === "roll" ? "csv" : c.kind === "batch" ? "jsonl" : "json";
  const sides = [];
  const oursOut = join(outDir, `${c.id}-ours.${ext}`);
  const oursArgv = [process.execPath, cli, ...c.ours(data.path, oursOut)];
  sides.push({ name: "ours", role: "ours", argv: oursArgv, out: oursOut });
  for (const v of c.variants) {
    const out = join(outDir, `${c.id}-ours-${v.args.join("")}.${ext}`);
    sides.push({ name: `ours ${v.label}`, role: "variant", argv: [process.execPath, cli, ...c.ours(data.path, out), ...v.args], out });
  }
  const missing = {};
  for (const peer of ["numpy", "polars", "duckdb"]) {
    if (!c.peers.includes(peer)) continue;
    if (!available(peer)) {
      missing[peer] = peerVersions[peer].missing ?? `numpy missing: ${peerVersions.numpy.missing}`;
      continue;
    }
    const out = join(outDir, `${c.id}-${peer}.${c.kind === "roll" ? "csv" : "json"}`);
    const job = JSON.stringify({ ...c.job, file: data.path, out });
    sides.push({ name: peer, role: "peer", argv: [python, join(root, "bench", "peers", `peer_${peer}.py`), job], out });
  }
  const floors = [
    { name: "node -e 0", argv: [process.execPath, "-e", "0"] },
    { name: "python -c pass", argv: [python, "-c", "pass"] },
    { name: "cat FILE", argv: ["cat", data.path] },
    { name: "wc -l FILE", argv: ["wc", "-l", data.path] },
  ];
  if (c.scaling) {
    // The fixed cost of a run (start-up, reading, writing) at default settings: ours on 300 rows.
    const tiny = dataFile(cacheDir, c.data, rowsScale, log, 300);
    floors.push({ name: "ours, 300 rows", argv: [process.execPath, cli, ...c.ours(tiny.path, join(outDir, `${c.id}-tiny.json`))] });
  }
  for (const f of floors) sides.push({ ...f, role: "floor", out: null });

  // Warm-up (untimed): each side once; its output is what the agreement check reads.
  for (const side of sides) measure(side.argv);
  const checks = {};
  for (const side of sides.filter((s) => s.role === "peer" || s.role === "variant")) {
    const check =
      side.role === "variant"
        ? checkIdentical(oursOut, side.out)
        : c.kind === "roll"
          ? checkRoll(oursOut, side.out)
          : checkSolve(c.kind, oursOut, side.out, c.job.pairs.length, c.tolerance ?? solveTolerance);
    checks[side.name] = check;
    const worst = `${check.compared} compared, worst relative difference ${check.worst.toExponential(1)} (${check.worstPath})`;
    if (!check.ok) {
      log(`(${c.id}) OUTPUTS DISAGREE: ours and ${side.name}: ${worst}\n  ${check.failures.slice(0, 12).join("\n  ")}`);
      log(`  ours: ${oursOut}\n  ${side.name}: ${side.out}`);
      process.exit(1);
    }
    log(`  agreement with ${side.name}: ${worst}`);
  }

  const runs = Object.fromEntries(sides.map((s) => [s.name, []]));
  for (let r = 0; r < rounds; r++) {
    // Interleaved: every side once per round, the order rotated from round to round.
    const order = sides.map((_, i) => sides[(i + r) % sides.length]);
    for (const side of order) runs[side.name].push(measure(side.argv));
    log(`  round ${r + 1}: ${sides.map((s) => `${s.name} ${runs[s.name].at(-1).seconds.toFixed(3)}`).join(", ")}`);
  }
  results.push({ case: c, data, rounds, sides, runs, checks, missing });
}
const loadAtEnd = loadavg();
const pageTouchAtEnd = pageTouch();

// ---- report ------------------------------------------------------------------------------------
const summary = results.map((r) => {
  const stat = (name) => {
    const s = r.runs[name].map((m) => m.seconds);
    const rss = r.runs[name].map((m) => m.rssMb).filter((x) => x !== null);
    const faults = r.runs[name].map((m) => m.faults).filter((x) => x !== null);
    return {
      median: median(s),
      min: Math.min(...s),
      max: Math.max(...s),
      rssMb: rss.length ? Math.max(...rss) : null,
      faults: faults.length ? median(faults) : null,
      all: s,
    };
  };
  const stats = Object.fromEntries(r.sides.map((s) => [s.name, stat(s.name)]));
  const peerMedians = Object.fromEntries(r.sides.filter((s) => s.role === "peer").map((s) => [s.name, stats[s.name].median]));
  const best = bestPeer(peerMedians);
  return {
    ...r,
    stats,
    best,
    ratioBest: ratio(stats.ours.median, best?.median),
    ratioNumpy: ratio(stats.ours.median, peerMedians.numpy),
  };
});
const full = !selected && rowsScale === 1;
const markdown = renderResults({
  summary,
  full,
  machine: {
    cpu: cpus()[0]?.model ?? "unknown",
    cores: cpus().length,
    memoryGiB: totalmem() / 2 ** 30,
    os: `${platform()} ${release()}`,
    node: process.version,
    python: `${pythonVersion} (${python})`,
    peers: peerVersions,
    loadAtStart,
    loadAtEnd,
    memorySource,
    pageTouch:
      pageTouchAtStart.length + pageTouchAtEnd.length === 0
        ? null
        : { atStart: pageTouchAtStart, atEnd: pageTouchAtEnd, median: median([...pageTouchAtStart, ...pageTouchAtEnd]) },
    date: new Date().toISOString(),
    rowsScale,
  },
  root,
  cacheDir,
  analysis: existsSync(join(root, "bench", "analysis.md")) ? readFileSync(join(root, "bench", "analysis.md"), "utf8") : "",
});
const target = full ? join(root, "bench", "RESULTS.md") : join(cacheDir, "RESULTS-partial.md");
writeFileSync(target, markdown);
log(`wrote ${target}`);
// Every output agreed (a disagreement exits above and keeps them for inspection): free the disk.
rmSync(outDir, { recursive: true, force: true });

// ---- agreement checks --------------------------------------------------------------------------
function checkSolve(kind, oursPath, peerPath, expectedPairs, tolerance) {
  const peer = readJson(peerPath);
  const ours =
    kind === "batch"
      ? readFileSync(oursPath, "utf8")
          .split("\n")
          .filter((line) => line !== "")
          .map((line) => JSON.parse(line))
      : [readJson(oursPath)];
  const byPair = new Map(ours.map((doc) => [`${doc.input?.lowColumn}\t${doc.input?.highColumn}`, doc]));
  const failures = [];
  if (ours.length !== expectedPairs) failures.push(`${ours.length} pairs in our output, ${expectedPairs} expected`);
  if (peer.pairs.length !== expectedPairs) failures.push(`${peer.pairs.length} pairs in the peer's output, ${expectedPairs} expected`);
  let worst = 0;
  let worstPath = null;
  let compared = 0;
  for (const p of peer.pairs) {
    const doc = kind === "batch" ? byPair.get(`${p.low}\t${p.high}`) : ours[0];
    if (doc === undefined) {
      failures.push(`pair ${p.low}/${p.high}: missing from our output`);
      continue;
    }
    const paths = peer.pathSets[p.paths] ?? [];
    const result = compareDigest(doc, Object.fromEntries(paths.map((path, i) => [path, p.values[i]])), tolerance);
    compared += result.compared;
    failures.push(...result.failures.map((f) => `${p.low}/${p.high} ${f}`));
    if (result.worst > worst || worstPath === null) {
      worst = result.worst;
      worstPath = result.worstPath;
    }
  }
  return { ok: failures.length === 0 && compared > 0, worst, worstPath, failures, compared };
}

/** Our own outputs under other settings (e.g. --threads 1) must be the same bytes. */
function checkIdentical(a, b) {
  const same = readFileSync(a).equals(readFileSync(b));
  return {
    ok: same,
    worst: same ? 0 : Number.POSITIVE_INFINITY,
    worstPath: "the output's bytes",
    failures: same ? [] : [`${a} and ${b} differ`],
    compared: 1,
  };
}

function checkRoll(oursPath, peerPath) {
  const mine = fileLines(oursPath);
  const theirs = fileLines(peerPath);
  const comparer = rollComparer(mine.next().value ?? "", theirs.next().value ?? "", rollTolerance);
  let ourRows = 0;
  let peerRows = 0;
  for (;;) {
    const a = mine.next();
    const b = theirs.next();
    if (!a.done && a.value !== "") ourRows++;
    if (!b.done && b.value !== "") peerRows++;
    if (a.done || b.done || a.value === "" || b.value === "") {
      for (let x = mine.next(); !x.done; x = mine.next()) if (x.value !== "") ourRows++;
      for (let y = theirs.next(); !y.done; y = theirs.next()) if (y.value !== "") peerRows++;
      break;
    }
    comparer.row(a.value, b.value);
  }
  return comparer.result(ourRows, peerRows);
}
