/**
 * Long typed arrays in fresh memory: the columns a reader fills and the scratch series of the passes
 * (scratch.ts). Fresh memory is costly on first touch (every 4 KiB page a fault: about 2.7 ms a MB on
 * the benchmark machine, a tenth of a 1M-row run), and a runtime with a core to spare can take those
 * faults on another thread ahead of the writes (cli/runtime/pretouch.ts). This module is where such a
 * runtime plugs in; without one (the library, the tests) every array is a plain allocation.
 *
 * A source must hand out zero-filled arrays of the asked length that behave as plain ones (they may
 * live in a SharedArrayBuffer), and must never change an element once handed out.
 */

/** Where long typed arrays come from. */
export interface FreshMemory {
  float64(length: number): Float64Array;
  int32(length: number): Int32Array;
  uint8(length: number): Uint8Array;
  /** True when the source readies the memory of its arrays ahead of the writes (see scratch.ts). */
  readonly readiesAhead: boolean;
}

const plain: FreshMemory = {
  float64: (length) => new Float64Array(length),
  int32: (length) => new Int32Array(length),
  uint8: (length) => new Uint8Array(length),
  readiesAhead: false,
};

let source: FreshMemory = plain;

/** Makes `memory` the source of fresh arrays (null: plain allocations again). */
export function useFreshMemory(memory: FreshMemory | null): void {
  source = memory ?? plain;
}

/** A zero-filled Float64Array of `length` from the current source. */
export const freshFloat64 = (length: number): Float64Array => source.float64(length);
/** A zero-filled Int32Array of `length` from the current source. */
export const freshInt32 = (length: number): Int32Array => source.int32(length);
/** A zero-filled Uint8Array of `length` from the current source. */
export const freshUint8 = (length: number): Uint8Array => source.uint8(length);
/** True when the current source readies memory ahead of the writes. */
export const freshMemoryReadiesAhead = (): boolean => source.readiesAhead;
