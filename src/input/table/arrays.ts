/** Plain-loop builders for typed arrays (TypedArray.from with a mapping function is slow on large inputs). */

/** Int32Array of the given length with element i = at(i). */
export function int32Of(length: number, at: (i: number) => number): Int32Array {
  const out = new Int32Array(length);
  for (let i = 0; i < length; i++) out[i] = at(i);
  return out;
}

/** Float64Array of the given length with element i = at(i). */
export function float64Of(length: number, at: (i: number) => number): Float64Array {
  const out = new Float64Array(length);
  for (let i = 0; i < length; i++) out[i] = at(i);
  return out;
}

/** Array of the given length with element i = at(i). */
export function arrayOf<T>(length: number, at: (i: number) => T): T[] {
  const out = new Array<T>(length);
  for (let i = 0; i < length; i++) out[i] = at(i);
  return out;
}

/** Arrays made by `identityOf` (never written to afterwards): isIdentity knows them without a pass. */
const identities = new WeakSet<Int32Array>();

/**
 * The counting array a[i] = i that `countingFrom` cuts its views from, while anything holds one. A
 * table's row indexes, its source lines and its identity order are all such runs: one array serves
 * them, not one each (4 bytes a row each, in fresh memory: see core/numerics/scratch.ts).
 */
let counting: WeakRef<Int32Array> | null = null;

/** Int32Array with a[i] = start + i; read-only (a view of one array shared by every such run). */
export function countingFrom(start: number, length: number): Int32Array {
  let all = counting?.deref();
  if (all === undefined || all.length < start + length) {
    all = new Int32Array(Math.max(start + length, 1024));
    for (let i = 0; i < all.length; i++) all[i] = i;
    counting = new WeakRef(all);
  }
  return all.subarray(start, start + length);
}

/** Int32Array with a[i] = i; the caller must not change it (isIdentity remembers it). */
export function identityOf(length: number): Int32Array {
  const a = countingFrom(0, length);
  identities.add(a);
  return a;
}

/** True when a[i] = i for every i. */
export function isIdentity(a: Int32Array): boolean {
  if (identities.has(a)) return true;
  for (let i = 0; i < a.length; i++) if (a[i] !== i) return false;
  return true;
}
