/**
 * Worker thread that readies fresh memory ahead of the writes (pretouch.ts): for each shared buffer it
 * is sent, it writes every 4 KiB page once, so that the page faults of first touch are taken here
 * instead of on the thread that fills the arrays. A write is an atomic add of 0: it never changes an
 * element, whatever the other thread wrote there first. The buffers are taken a step each in turn,
 * from their start, as the arrays are filled; buffers sent meanwhile join at the next turn. When none
 * is left it collects its heap, letting go of them.
 */
import { setFlagsFromString } from "node:v8";
import { runInNewContext } from "node:vm";
import { parentPort, receiveMessageOnPort } from "node:worker_threads";

/** A buffer being readied: its words and the next word to touch. */
export interface Pending {
  readonly words: Int32Array;
  at: number;
}

/** Words in a page of 4 KiB. */
const PAGE_WORDS = 1024;
/** Words of a buffer readied in one turn (512 KiB). */
const TURN_WORDS = 1 << 17;

/** A buffer's words as a pending entry (a length not a multiple of 4 bytes leaves its tail, in the last page, alone). */
export const pendingOf = (buffer: SharedArrayBuffer): Pending => ({ words: new Int32Array(buffer, 0, buffer.byteLength >> 2), at: 0 });

/** One turn: a step of each pending buffer, in order; those done leave the list. */
export function touchTurn(pending: Pending[]): void {
  for (let i = 0; i < pending.length; ) {
    const entry = pending[i]!;
    const { words } = entry;
    const end = Math.min(words.length, entry.at + TURN_WORDS);
    for (let w = entry.at; w < end; w += PAGE_WORDS) Atomics.add(words, w, 0);
    entry.at = end;
    if (end >= words.length) pending.splice(i, 1);
    else i++;
  }
}

const port = parentPort;
if (port !== null) {
  // This thread's handle on a buffer holds its memory until this thread's heap is collected, which an
  // idle thread never does by itself: it collects once every buffer it was sent is ready, so that the
  // arrays the run drops are freed (else a run over several files would hold all of their columns).
  setFlagsFromString("--expose-gc");
  const collect = runInNewContext("gc") as () => void;
  const pending: Pending[] = [];
  port.on("message", (buffer: SharedArrayBuffer) => {
    pending.push(pendingOf(buffer));
    // Turns until every buffer is ready, taking the buffers sent meanwhile without waiting for events.
    while (pending.length > 0) {
      for (let m = receiveMessageOnPort(port); m !== undefined; m = receiveMessageOnPort(port)) pending.push(pendingOf(m.message));
      touchTurn(pending);
    }
    // After this handler has returned (its argument is the last handle), unless more have come by then.
    setImmediate(() => {
      if (pending.length === 0) collect();
    });
  });
}
