// The benchmark's data files, generated deterministically (a seeded xoshiro128** stream, Box-Muller
// normals, a one-factor model) and cached: a file is written once under its name, which carries the
// generator's version and every parameter, and reused by later runs. Numbers are written with 9
// decimals, as an export would.
import { closeSync, existsSync, mkdirSync, openSync, renameSync, statSync, writeSync } from "node:fs";
import { join } from "node:path";

const generatorVersion = 1;

/** xoshiro128** (Blackman & Vigna), seeded through splitmix32; uniform doubles in (0, 1) from 53 bits. */
function createStream(seed) {
  let x = seed >>> 0;
  const splitmix = () => {
    x = (x + 0x9e3779b9) >>> 0;
    let z = x;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return (z ^ (z >>> 16)) >>> 0;
  };
  const s = Uint32Array.of(splitmix(), splitmix(), splitmix(), splitmix());
  const next = () => {
    const result = Math.imul(rotl(Math.imul(s[1], 5) >>> 0, 7), 9) >>> 0;
    const t = (s[1] << 9) >>> 0;
    s[2] ^= s[0];
    s[3] ^= s[1];
    s[1] ^= s[2];
    s[0] ^= s[3];
    s[2] ^= t;
    s[3] = rotl(s[3], 11);
    return result;
  };
  const uniform = () => ((next() >>> 5) * 67108864 + (next() >>> 6) + 0.5) / 9007199254740992;
  let spare = null;
  const normal = () => {
    if (spare !== null) {
      const value = spare;
      spare = null;
      return value;
    }
    const r = Math.sqrt(-2 * Math.log(uniform()));
    const angle = 2 * Math.PI * uniform();
    spare = r * Math.sin(angle);
    return r * Math.cos(angle);
  };
  return { normal };
}
const rotl = (v, k) => ((v << k) | (v >>> (32 - k))) >>> 0;

const pad = (n, width = 2) => String(n).padStart(width, "0");
const isoDay = (ms) => {
  const d = new Date(ms);
  return `${pad(d.getUTCFullYear(), 4)}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())}`;
};
/** Business days (Monday to Friday) from 2000-01-03 on, as ISO dates. */
function* businessDays() {
  let ms = Date.UTC(2000, 0, 3);
  for (;;) {
    const weekday = new Date(ms).getUTCDay();
    if (weekday !== 0 && weekday !== 6) yield isoDay(ms);
    ms += 86_400_000;
  }
}
/** Minute stamps "YYYY-MM-DD HH:MM" from 09:30 to 15:59 (390 a day) on business days. */
function* tradingMinutes() {
  const times = Array.from({ length: 390 }, (_, i) => ` ${pad(9 + Math.floor((30 + i) / 60))}:${pad((30 + i) % 60)}`);
  for (const day of businessDays()) for (const time of times) yield day + time;
}

/**
 * Writes `rows` rows of `header` to `path` (through a temporary file renamed at the end), each row
 * from `row(i)` without its line end.
 */
function writeRows(path, header, rows, row) {
  const temporary = `${path}.partial`;
  const fd = openSync(temporary, "w");
  let chunk = `${header}\n`;
  for (let i = 0; i < rows; i++) {
    chunk += `${row(i)}\n`;
    if (chunk.length > 1 << 22) {
      writeSync(fd, chunk);
      chunk = "";
    }
  }
  writeSync(fd, chunk);
  closeSync(fd);
  renameSync(temporary, path);
}

/**
 * The data sets, by name: rows, columns and how each row is drawn. Per period: factor sd 0.01, mean
 * 0.0004; structural betas 0.7 (low) and 1.3 (high); noise sd 0.004 and 0.006; rf a slow sine.
 */
export const dataSets = {
  daily2520: { rows: 2_520, description: "2,520 business days: date,low,high,rf" },
  daily1m: { rows: 1_000_000, description: "1,000,000 business days: date,low,high,rf,other" },
  daily10k: { rows: 10_000, description: "10,000 business days: date,low,high,rf,other" },
  daily100k: { rows: 100_000, description: "100,000 business days: date,low,high,rf,other" },
  wide50: { rows: 2_520, description: "2,520 business days, 50 return columns l01..l25, h01..h25" },
  minutes10m: { rows: 10_000_000, description: "10,000,000 minute stamps (09:30-15:59 on business days): time,low,high" },
  factor10: { rows: 10_000, description: "10,000 business days, 10 beta-sorted portfolios P1..P10 and rf" },
};

function generate(name, rows, path) {
  const fmt = (x) => x.toFixed(9);
  const seed = { daily2520: 1, daily1m: 2, wide50: 3, minutes10m: 4, factor10: 5, daily10k: 6, daily100k: 7 }[name];
  const { normal } = createStream(seed);
  const pair = () => {
    const f = 0.0004 + 0.01 * normal();
    return [0.7 * f + 0.004 * normal(), 1.3 * f + 0.006 * normal()];
  };
  if (name.startsWith("daily")) {
    const days = businessDays();
    const other = name !== "daily2520";
    writeRows(path, other ? "date,low,high,rf,other" : "date,low,high,rf", rows, (i) => {
      const rf = 0.00008 + 0.00004 * Math.sin(i / 500);
      const [low, high] = pair();
      const base = `${days.next().value},${fmt(low + rf)},${fmt(high + rf)},${fmt(rf)}`;
      return other ? `${base},${fmt(0.0003 + 0.012 * normal())}` : base;
    });
  } else if (name === "wide50") {
    const days = businessDays();
    const names = [...Array.from({ length: 25 }, (_, i) => `l${pad(i + 1)}`), ...Array.from({ length: 25 }, (_, i) => `h${pad(i + 1)}`)];
    const betas = names.map((_, j) => (j < 25 ? 0.55 + 0.01 * j : 1.2 + 0.02 * (j - 25)));
    const noise = names.map((_, j) => (j < 25 ? 0.003 + 0.0001 * j : 0.005 + 0.0001 * (j - 25)));
    writeRows(path, `date,${names.join(",")}`, rows, () => {
      const f = 0.0004 + 0.01 * normal();
      let line = days.next().value;
      for (let j = 0; j < names.length; j++) line += `,${fmt(betas[j] * f + noise[j] * normal())}`;
      return line;
    });
  } else if (name === "factor10") {
    const days = businessDays();
    // Loadings 0.5 to 1.5 in steps of 1/9, noise sd 0.003 to 0.0066.
    const betas = Array.from({ length: 10 }, (_, j) => 0.5 + j / 9);
    const noise = Array.from({ length: 10 }, (_, j) => 0.003 + 0.0004 * j);
    const names = betas.map((_, j) => `P${j + 1}`);
    writeRows(path, `date,${names.join(",")},rf`, rows, (i) => {
      const rf = 0.00008 + 0.00004 * Math.sin(i / 500);
      const f = 0.0004 + 0.01 * normal();
      let line = days.next().value;
      for (let j = 0; j < names.length; j++) line += `,${fmt(betas[j] * f + noise[j] * normal() + rf)}`;
      return `${line},${fmt(rf)}`;
    });
  } else if (name === "minutes10m") {
    const minutes = tradingMinutes();
    // Per minute: a tenth of the daily scale.
    writeRows(path, "time,low,high", rows, () => {
      const f = 0.00004 + 0.001 * normal();
      return `${minutes.next().value},${fmt(0.7 * f + 0.0004 * normal())},${fmt(1.3 * f + 0.0006 * normal())}`;
    });
  } else {
    throw new Error(`unknown data set ${name}`);
  }
}

/**
 * The path of data set `name` in `cacheDir`, generated first if it is not there. `rowsScale` (< 1
 * for quick checks) shrinks the row count; the file name says so.
 */
export function dataFile(cacheDir, name, rowsScale = 1, log = () => {}, fixedRows = null) {
  const spec = dataSets[name];
  if (spec === undefined) throw new Error(`unknown data set ${name}`);
  const rows = fixedRows ?? Math.max(300, Math.round(spec.rows * rowsScale));
  mkdirSync(cacheDir, { recursive: true });
  const path = join(cacheDir, `${name}-v${generatorVersion}-${rows}.csv`);
  if (!existsSync(path)) {
    log(`generating ${path} (${rows} rows)`);
    generate(name, rows, path);
  }
  return { path, rows, bytes: statSync(path).size, description: spec.description };
}
