/**
 * Fresh memory readied on a worker thread (core/numerics/freshMemory.ts). Every long array a run
 * fills (a large file's columns and row starts, the uncertainty's scratch series) is first touched
 * page by page, and each first touch is a fault: about 2.7 ms a MB on the virtual machines we measure
 * on, a tenth of a 1M-row run. With this source such arrays live in shared memory and a worker
 * (pretouchWorker.ts) writes each page once while this thread works, so most faults are taken there.
 * The arrays are the same zero-filled arrays either way: the worker's writes are atomic adds of 0.
 *
 * BETABOUND_PREFAULT=off turns it off; auto (the default) uses it with two cores or more; on uses it
 * whenever a worker can start. Measured on 2 cores (interleaved medians, 2026-12-04): 1M rows 0.53 to
 * 0.47 s without the uncertainty and 0.96 to 0.85 s with it; 10M minute rows with huge pages
 * (hugePages.ts) 5.47 to 4.80 s with the uncertainty (its scratch series), and without it 1.83 to 1.63 s
 * in one set of rounds and unchanged in another.
 */
import { existsSync } from "node:fs";
import { createRequire } from "node:module";
import { availableParallelism } from "node:os";
import { fileURLToPath } from "node:url";
import { runInNewContext } from "node:vm";
import type { Worker } from "node:worker_threads";
import type { FreshMemory } from "../../core/numerics/freshMemory.js";
import { readSwitch } from "./switchSetting.js";

/** The worker script next to the bundled CLI; absent when running from source (tests): no worker. */
const workerUrl = new URL("./pretouchWorker.js", import.meta.url);

/**
 * Arrays from this many bytes on are readied on the worker (smaller ones are plain): the worker is
 * started by the first of them (tens of milliseconds, on the other core).
 */
export const pretouchFrom = 1 << 20;

/** What the decision depends on besides the environment. */
export interface PrefaultFacts {
  readonly cores: number;
  readonly workerScript: boolean;
}

/** Whether to ready fresh memory on a worker, and the warning for a setting it does not know. */
export function wantsPrefault(env: NodeJS.ProcessEnv, facts: PrefaultFacts): { use: boolean; warning: string | null } {
  const { setting, warning } = readSwitch(env, "BETABOUND_PREFAULT");
  if (setting === "off" || !facts.workerScript) return { use: false, warning };
  return { use: setting === "on" || facts.cores >= 2, warning };
}

/** The facts of this process. */
export const prefaultFacts = (): PrefaultFacts => ({ cores: availableParallelism(), workerScript: existsSync(fileURLToPath(workerUrl)) });

/** What pretouchingMemory needs of its worker (a worker thread's own methods). */
export type PretouchWorker = Pick<Worker, "postMessage" | "unref" | "on">;

/** The worker thread of pretouchWorker.js. */
function startPretouchWorker(): PretouchWorker {
  const { Worker: WorkerThread } = createRequire(import.meta.url)("node:worker_threads") as typeof import("node:worker_threads");
  return new WorkerThread(workerUrl);
}

/**
 * Shared memory is not counted by V8's collector as a plain ArrayBuffer's is: shared arrays a run has
 * dropped (a file's columns once its pairs are solved) would stay until the process ends. So a full
 * collection is run before handing out more once this many bytes were handed out since the last one
 * (measured: 30 arrays of 20 MB dropped one after another peaked at 619 MB shared against 104 MB plain,
 * and at 162 MB with a collection every 128 MiB, 6.5 ms each).
 */
export const collectEvery = 128 << 20;

let collector: (() => void) | null = null;

/** A full collection of this isolate (V8's expose-gc, set when first needed, for contexts made from then on). */
function fullCollection(): void {
  if (collector === null) {
    // Loaded here: most runs never collect (node:v8 is not loaded at start-up).
    const { setFlagsFromString } = createRequire(import.meta.url)("node:v8") as typeof import("node:v8");
    setFlagsFromString("--expose-gc");
    collector = runInNewContext("gc") as () => void;
  }
  collector();
}

/** A FreshMemory whose long arrays are readied on a worker thread, started at the first of them. */
export function pretouchingMemory(
  startWorker: () => PretouchWorker = startPretouchWorker,
  collect: () => void = fullCollection,
): FreshMemory {
  let worker: PretouchWorker | null = null;
  let broken = false;
  let sinceCollected = 0;
  const start = (): PretouchWorker => {
    const started = startWorker();
    // It must not keep the process alive, and a worker that fails only leaves pages to this thread.
    started.unref();
    started.on("error", () => {
      broken = true;
    });
    return started;
  };
  /** A shared buffer of `bytes` (rounded up to whole words) sent to the worker, or null to allocate plainly. */
  const shared = (bytes: number): SharedArrayBuffer | null => {
    if (bytes < pretouchFrom || broken) return null;
    try {
      worker ??= start();
      const rounded = Math.ceil(bytes / 4) * 4;
      if (sinceCollected > 0 && sinceCollected + rounded > collectEvery) {
        collect();
        sinceCollected = 0;
      }
      sinceCollected += rounded;
      const buffer = new SharedArrayBuffer(rounded);
      worker.postMessage(buffer);
      return buffer;
    } catch {
      broken = true;
      return null;
    }
  };
  return {
    float64: (length) => {
      const buffer = shared(8 * length);
      return buffer === null ? new Float64Array(length) : new Float64Array(buffer, 0, length);
    },
    int32: (length) => {
      const buffer = shared(4 * length);
      return buffer === null ? new Int32Array(length) : new Int32Array(buffer, 0, length);
    },
    uint8: (length) => {
      const buffer = shared(length);
      return buffer === null ? new Uint8Array(length) : new Uint8Array(buffer, 0, length);
    },
    readiesAhead: true,
  };
}
