// The benchmark's pure parts: medians and ratios, the numbers of our outputs by their JSON paths, and
// the agreement checks between our output and a peer's (each returns { ok, worst, failures, compared }).

/** Median of a non-empty list of numbers. */
export function median(values) {
  if (values.length === 0) throw new RangeError("median of no values");
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/** ours / theirs, or null when either is missing or theirs is not positive. */
export function ratio(ours, theirs) {
  if (ours == null || theirs == null || !(theirs > 0)) return null;
  return ours / theirs;
}

/** The peer with the smallest median time among those measured (null if none). */
export function bestPeer(medians) {
  let best = null;
  for (const [name, value] of Object.entries(medians)) {
    if (value == null) continue;
    if (best === null || value < best.median) best = { name, median: value };
  }
  return best;
}

/**
 * |a - b| / max(|a|, |b|, floor): relative difference, with `floor` the magnitude below which a
 * difference is judged absolutely (0: purely relative). Both undefined (null or NaN) gives 0; one of
 * them undefined gives Infinity.
 */
export function relativeDifference(a, b, floor = 0) {
  const undefinedA = a === null || a === undefined || Number.isNaN(a);
  const undefinedB = b === null || b === undefined || Number.isNaN(b);
  if (undefinedA && undefinedB) return 0;
  if (undefinedA || undefinedB) return Number.POSITIVE_INFINITY;
  if (a === b) return 0;
  return Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b), floor);
}

/** The value at a dotted path of a parsed JSON document (undefined when absent). */
export function at(document, path) {
  let node = document;
  for (const part of path.split(".")) {
    if (node === null || typeof node !== "object") return undefined;
    node = node[part];
  }
  return node;
}

/**
 * Compares `peer` (an object of numbers by JSON path) with our JSON document `ours`: every path of
 * the peer's must be in ours and agree to `tolerance(path)` (a relative tolerance, or
 * { relative, floor }; null: not compared). Returns the worst difference and a line per failure.
 */
export function compareDigest(ours, peer, tolerance) {
  const failures = [];
  let worst = 0;
  let worstPath = null;
  let compared = 0;
  for (const [path, theirs] of Object.entries(peer)) {
    const mine = at(ours, path);
    const spec = tolerance(path);
    if (spec === null) continue;
    const { relative, floor } = typeof spec === "number" ? { relative: spec, floor: 0 } : spec;
    if (mine === undefined) {
      failures.push(`${path}: missing from our output (peer ${theirs})`);
      continue;
    }
    const difference = relativeDifference(mine, theirs, floor);
    compared++;
    if (worstPath === null || difference > worst) {
      worst = difference;
      worstPath = path;
    }
    if (!(difference <= relative))
      failures.push(`${path}: ours ${mine}, peer ${theirs}, difference ${difference.toExponential(2)} > ${relative}`);
  }
  return { ok: failures.length === 0 && compared > 0, worst, worstPath, failures, compared };
}

/** Undefined cells of a CSV: empty (ours) or the peers' spellings of NaN and NULL. */
const undefinedCell = new Set(["", "nan", "NaN", "null", "NULL"]);
export const cellValue = (text) => (undefinedCell.has(text) ? Number.NaN : Number(text));

/**
 * A row-by-row comparer of two CSV outputs, aligned by column name (never by position): `headers`
 * are the two header lines; the peer's columns other than start and end must all be in ours. Feed it
 * row pairs with `row(ourLine, peerLine)`; `result()` gives the summary. Dates are compared as text.
 */
export function rollComparer(ourHeader, peerHeader, tolerance) {
  const mine = ourHeader.split(",");
  const theirs = peerHeader.split(",");
  const failures = [];
  const columns = [];
  for (const [j, name] of theirs.entries()) {
    const i = mine.indexOf(name);
    if (i < 0) failures.push(`column ${name}: missing from our output`);
    else columns.push({ name, i, j, worst: 0 });
  }
  let rows = 0;
  const row = (ourLine, peerLine) => {
    const a = ourLine.split(",");
    const b = peerLine.split(",");
    for (const c of columns) {
      if (c.name === "start" || c.name === "end") {
        if (a[c.i] !== b[c.j] && failures.length < 20) failures.push(`row ${rows + 1} ${c.name}: ours ${a[c.i]}, peer ${b[c.j]}`);
        continue;
      }
      const spec = tolerance(c.name);
      const { relative, floor } = typeof spec === "number" ? { relative: spec, floor: 0 } : spec;
      const difference = relativeDifference(cellValue(a[c.i]), cellValue(b[c.j]), floor);
      if (difference > c.worst) c.worst = difference;
      if (!(difference <= relative) && failures.length < 20) {
        failures.push(`row ${rows + 1} ${c.name}: ours ${a[c.i]}, peer ${b[c.j]}, difference ${difference.toExponential(2)} > ${relative}`);
      }
    }
    rows++;
  };
  const result = (ourRows, peerRows) => {
    if (ourRows !== peerRows) failures.unshift(`${ourRows} windows in ours, ${peerRows} in the peer's`);
    let worst = 0;
    let worstPath = null;
    for (const c of columns) {
      if (c.worst >= worst && c.name !== "start" && c.name !== "end") {
        worst = c.worst;
        worstPath = c.name;
      }
    }
    return { ok: failures.length === 0 && rows > 0, worst, worstPath, failures, compared: rows };
  };
  return { row, result };
}

/** Seconds with 3 significant decimals, or "-". */
export const seconds = (x) => (x == null ? "-" : x < 10 ? x.toFixed(3) : x.toFixed(1));
/** A ratio as "0.59", or "-". */
export const ratioText = (x) => (x == null ? "-" : x.toFixed(2));
