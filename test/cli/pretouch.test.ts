/**
 * Readying fresh memory on a worker thread (src/cli/runtime/pretouch.ts, pretouchWorker.ts): when it
 * is used, the arrays it hands out to a worker (a fake one here), and the worker's
 * turns, which touch every page of every buffer without changing a value another thread wrote (the
 * worker itself runs in the end-to-end test, from the built files).
 */
import { describe, expect, it } from "vitest";
import { EventEmitter } from "node:events";
import { collectEvery, type PretouchWorker, pretouchingMemory, pretouchFrom, wantsPrefault } from "../../src/cli/runtime/pretouch.js";
import { type Pending, pendingOf, touchTurn } from "../../src/cli/runtime/pretouchWorker.js";

describe("whether fresh memory is readied on a worker", () => {
  const facts = { cores: 2, workerScript: true };

  it("is used with two cores or more unless turned off, never without the worker's script", () => {
    expect(wantsPrefault({}, facts)).toEqual({ use: true, warning: null });
    expect(wantsPrefault({ BETABOUND_PREFAULT: "auto" }, { ...facts, cores: 1 }).use).toBe(false);
    expect(wantsPrefault({ BETABOUND_PREFAULT: "on" }, { ...facts, cores: 1 }).use).toBe(true);
    expect(wantsPrefault({ BETABOUND_PREFAULT: "off" }, facts).use).toBe(false);
    expect(wantsPrefault({ BETABOUND_PREFAULT: "on" }, { ...facts, workerScript: false }).use).toBe(false);
    // In a process with huge pages as well (measured: it gains there with the uncertainty's series).
    expect(wantsPrefault({ GLIBC_TUNABLES: "glibc.malloc.hugetlb=1" }, facts).use).toBe(true);
  });

  it("warns about a setting it does not know and acts as auto", () => {
    expect(wantsPrefault({ BETABOUND_PREFAULT: "yes" }, facts)).toEqual({
      use: true,
      warning: 'warning: BETABOUND_PREFAULT is "yes", not one of auto, on, off; using auto\n',
    });
  });
});

describe("the worker's turns", () => {
  /** Runs turns until every buffer is done; returns how many turns it took. */
  const drain = (pending: Pending[]): number => {
    let turns = 0;
    while (pending.length > 0 && turns < 1000) {
      touchTurn(pending);
      turns++;
    }
    return turns;
  };

  it("take every buffer in steps of 512 KiB each in turn, and drop those done", () => {
    const small = new SharedArrayBuffer(4096 * 3);
    const large = new SharedArrayBuffer(3 * 512 * 1024 + 8);
    const pending = [pendingOf(small), pendingOf(large)];
    touchTurn(pending);
    expect(pending.length).toBe(1);
    expect(pending[0]!.at).toBe(1 << 17);
    expect(drain(pending)).toBe(3);
  });

  it("change no value written before or between turns, whatever its place in a page", () => {
    const buffer = new SharedArrayBuffer(8 * 400_000);
    const values = new Float64Array(buffer);
    for (let i = 0; i < values.length; i += 97) values[i] = Math.sin(i) * 1e300;
    values[0] = -0;
    const pending = [pendingOf(buffer)];
    touchTurn(pending);
    // Another thread goes on writing: a value where the next turn touches.
    values[(1 << 16) + 0] = 42.5;
    values[values.length - 1] = -7;
    drain(pending);
    for (let i = 0; i < values.length; i += 97)
      if (i !== 1 << 16) expect(Object.is(values[i], i === 0 ? -0 : Math.sin(i) * 1e300)).toBe(true);
    expect(values[1 << 16]).toBe(42.5);
    expect(values[values.length - 1]).toBe(-7);
  });

  it("change no byte of a buffer that holds bytes (a Uint8Array's)", () => {
    const buffer = new SharedArrayBuffer(4 * 1000);
    const bytes = new Uint8Array(buffer);
    bytes.fill(9);
    drain([pendingOf(buffer)]);
    expect(bytes.every((b) => b === 9)).toBe(true);
  });
});

/** A worker that records what it is sent. */
class FakeWorker extends EventEmitter {
  readonly posted: SharedArrayBuffer[] = [];
  unreffed = false;
  postMessage(buffer: SharedArrayBuffer): void {
    this.posted.push(buffer);
  }
  unref(): void {
    this.unreffed = true;
  }
}

describe("the arrays readied on a worker", () => {
  const setUp = () => {
    const workers: FakeWorker[] = [];
    const collected: number[] = [];
    const memory = pretouchingMemory(
      () => {
        const worker = new FakeWorker();
        workers.push(worker);
        return worker as unknown as PretouchWorker;
      },
      () => collected.push(workers[0]?.posted.length ?? 0),
    );
    return { workers, memory, collected };
  };
  const long = pretouchFrom / 8;

  it("are plain below 1 MiB and shared from it on, zero-filled, of the asked length; the worker is started by the first", () => {
    const { workers, memory } = setUp();
    expect(memory.float64(long - 1).buffer).toBeInstanceOf(ArrayBuffer);
    expect(workers).toHaveLength(0);
    const a = memory.float64(long);
    const b = memory.int32(pretouchFrom / 4 + 1);
    const c = memory.uint8(pretouchFrom + 3);
    expect([a.length, b.length, c.length]).toEqual([long, pretouchFrom / 4 + 1, pretouchFrom + 3]);
    expect(a.buffer).toBeInstanceOf(SharedArrayBuffer);
    expect(c.buffer.byteLength % 4).toBe(0);
    expect(a.every((x) => x === 0) && b.every((x) => x === 0) && c.every((x) => x === 0)).toBe(true);
    expect(workers).toHaveLength(1);
    expect(workers[0]!.unreffed).toBe(true);
    expect(workers[0]!.posted).toEqual([a.buffer, b.buffer, c.buffer]);
  });

  it("runs a full collection before handing out more than 128 MiB since the last (shared memory is not counted by V8)", () => {
    const { workers, memory, collected } = setUp();
    const quarter = collectEvery / 4 / 8;
    for (let k = 0; k < 4; k++) memory.float64(quarter);
    expect(collected).toEqual([]);
    memory.float64(quarter);
    // Before the fifth quarter: four had been sent.
    expect(collected).toEqual([4]);
    for (let k = 0; k < 3; k++) memory.float64(quarter);
    memory.float64(long - 1); // plain: not counted
    expect(collected).toEqual([4]);
    memory.float64(quarter);
    expect(collected).toEqual([4, 8]);
    expect(workers[0]!.posted).toHaveLength(9);
  });

  it("hands out plain arrays for good once the worker fails", () => {
    const { workers, memory } = setUp();
    memory.float64(long);
    workers[0]!.emit("error", new Error("gone"));
    expect(memory.float64(long).buffer).toBeInstanceOf(ArrayBuffer);
    expect(workers).toHaveLength(1);
  });
});
