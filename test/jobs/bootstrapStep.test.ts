/** The bootstrap step's choice of threads (src/jobs/bootstrapStep.ts): one where a second does not pay. */
import { describe, expect, it } from "vitest";
import { bootstrapThreads, inThisThread, runBootstrap, threadsPayFrom } from "../../src/jobs/bootstrapStep.js";
import type { BootstrapExecutor, JobContext } from "../../src/jobs/context.js";

function sample(n: number) {
  const low = Float64Array.from({ length: n }, (_, t) => Math.sin(t) * 0.01);
  const high = Float64Array.from({ length: n }, (_, t) => Math.sin(t + 1) * 0.015 + Math.cos(3 * t) * 0.004);
  return { low, high, weight: 0.5 };
}

describe("bootstrap threads", () => {
  it("one thread below the work size where a second pays, those asked for above it", () => {
    expect(bootstrapThreads(2520, 10_000, 2)).toBe(1);
    expect(bootstrapThreads(25_200, 2000, 2)).toBe(2);
    expect(bootstrapThreads(threadsPayFrom / 1000, 1000, 4)).toBe(4);
    expect(bootstrapThreads(threadsPayFrom / 1000 - 1, 1000, 4)).toBe(1);
  });

  it("the executor is handed the threads chosen, and the summary does not depend on them", async () => {
    const asked: number[] = [];
    const recording: BootstrapExecutor = (task, threads, progress) => {
      asked.push(threads);
      return inThisThread(task, threads, progress);
    };
    const settings = { replicates: 600, blockLength: 5, seed: 3, confidence: 0.95, threads: 2 } as const;
    const read: JobContext["read"] = async () => {
      throw new Error("no files here");
    };
    const small = await runBootstrap(sample(300), settings, { read, bootstrap: recording });
    const plain = await runBootstrap(sample(300), { ...settings, threads: 1 }, { read });
    expect(asked).toEqual([1]);
    expect(small).toEqual(plain);
  });
});
