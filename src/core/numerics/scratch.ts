/**
 * Scratch series: the long Float64Arrays a run's passes need for a while (influence series, scores,
 * residuals) are borrowed from a pool and given back when dead, so that the next pass reuses memory
 * already touched instead of fresh memory. Fresh memory is costly: every 4 KiB page is a fault on
 * first touch (about 10 microseconds each on a virtual machine, 20 ms for a million doubles), and
 * garbage to collect afterwards.
 *
 * The pool lives only inside `withScratch` (the outermost call makes it, its end drops it), so a
 * library caller keeps nothing between calls. A borrowed array holds arbitrary numbers: the borrower
 * writes every element before reading it. An array is given back only when nothing refers to it any
 * more. Short series (below SCRATCH_MIN) are plain allocations: they cost little either way.
 */

import { freshFloat64, freshMemoryReadiesAhead } from "./freshMemory.js";

/** Series shorter than this are allocated, not pooled. */
export const SCRATCH_MIN = 1024;
/** Most arrays the pool holds at once (the rest are left to the collector). */
const MAX_HELD = 24;
/**
 * With fresh memory readied ahead (freshMemory.ts): series from this length (2 MiB) on are borrowed
 * SERIES_AHEAD at a time more, once per pool (all six at once when a job expects them, expectSeries):
 * one pair's default uncertainty holds five of them at its peak, its pricing section six.
 */
const AHEAD_MIN = 1 << 18;
const SERIES_AHEAD = 5;

interface Pool {
  length: number;
  readonly free: Float64Array[];
  /** Series were borrowed ahead already. */
  ahead: boolean;
}

let active: Pool | null = null;

/** Runs `work` with a scratch pool (the one already open, if any). */
export function withScratch<T>(work: () => T): T {
  if (active !== null) return work();
  active = { length: -1, free: [], ahead: false };
  try {
    return work();
  } finally {
    active = null;
  }
}

/** `withScratch` for asynchronous work: the pool stays open until `work` settles. */
export async function withScratchAsync<T>(work: () => Promise<T>): Promise<T> {
  if (active !== null) return work();
  const pool: Pool = { length: -1, free: [], ahead: false };
  active = pool;
  try {
    return await work();
  } finally {
    if (active === pool) active = null;
  }
}

/** A Float64Array of length n with arbitrary contents: the caller writes every element before reading it. */
export function borrowSeries(n: number): Float64Array {
  const pool = active;
  if (n < SCRATCH_MIN) return new Float64Array(n);
  if (pool === null) return freshFloat64(n);
  if (pool.length === n) {
    const free = pool.free.pop();
    if (free !== undefined) return free;
  } else {
    // The pool's first long series: a few more, their memory readied on another thread while the passes run.
    borrowAhead(pool, n, SERIES_AHEAD);
  }
  return freshFloat64(n);
}

/**
 * Tells the pool that series of n rows are coming (a job about to assess the uncertainty and the
 * pricing section of a sample of n rows, six series at their peak): with fresh memory readied ahead,
 * the series the first long borrow would take ahead are taken now, one more besides, so that the other thread readies their pages while the job does other
 * work first (the solve, before the uncertainty; measured in bench/analysis.md). Does nothing outside
 * a scope, for shorter series, without such memory, or once the pool has borrowed ahead.
 */
export function expectSeries(n: number): void {
  if (active !== null) borrowAhead(active, n, SERIES_AHEAD + 1);
}

/** Puts `count` fresh series of n rows in the pool, once per pool, when long enough and readied ahead. */
function borrowAhead(pool: Pool, n: number, count: number): void {
  if (n < AHEAD_MIN || pool.ahead || !freshMemoryReadiesAhead()) return;
  pool.ahead = true;
  pool.length = n;
  pool.free.length = 0;
  for (let i = 0; i < count; i++) pool.free.push(freshFloat64(n));
}

/** Gives arrays back to the pool; the caller must hold no other reference to them. */
export function giveBack(...arrays: Float64Array[]): void {
  const pool = active;
  if (pool === null) return;
  for (const array of arrays) {
    if (array.length < SCRATCH_MIN) continue;
    if (array.length !== pool.length) {
      pool.length = array.length;
      pool.free.length = 0;
    }
    if (pool.free.length < MAX_HELD && !pool.free.includes(array)) pool.free.push(array);
  }
}
