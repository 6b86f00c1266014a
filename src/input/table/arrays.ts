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

/** Int32Array with a[i] = i; the caller must not change it (isIdentity remembers it). */
export function identityOf(length: number): Int32Array {
  const a = new Int32Array(length);
  for (let i = 0; i < length; i++) a[i] = i;
  identities.add(a);
  return a;
}

/** True when a[i] = i for every i. */
export function isIdentity(a: Int32Array): boolean {
  if (identities.has(a)) return true;
  for (let i = 0; i < a.length; i++) if (a[i] !== i) return false;
  return true;
}
