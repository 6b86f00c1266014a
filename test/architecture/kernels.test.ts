/**
 * Every WebAssembly kernel's committed binary (its generated *Wasm.ts module) is the assembly of its
 * committed .wat text: the list is scripts/buildKernels.mjs's own, so a kernel added there is checked
 * here too. Regenerate with `npm run build:kernels` after editing a .wat.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";

interface Kernel {
  readonly wat: string;
  readonly module: string;
  readonly constant: string;
}
interface BuildScript {
  readonly kernels: readonly Kernel[];
  assembleKernel(wat: string): Promise<string>;
  kernelText(wat: string): string;
  kernelModuleText(kernel: Kernel, base64: string): string;
}

describe("the WebAssembly kernels", async () => {
  const script = "../../scripts/buildKernels.mjs";
  const { kernels, assembleKernel, kernelModuleText, kernelText } = (await import(script)) as BuildScript;

  it("are the eight the code loads", () => {
    expect(kernels.map((k) => k.constant).sort()).toEqual([
      "autocovarianceKernelWasm",
      "columnKernelWasm",
      "csvRowsKernelWasm",
      "eliminationKernelWasm",
      "influenceKernelWasm",
      "matrixKernelWasm",
      "rowKernelWasm",
      "seriesKernelWasm",
    ]);
  });

  it("assemble a kernel's included parts in place of their include lines (csvRowsKernel.wat's Ryu, in ryu.wat)", () => {
    const text = kernelText("report/csvRowsKernel.wat");
    const part = readFileSync(new URL("../../src/report/ryu.wat", import.meta.url), "utf8");
    expect(text).toContain(part);
    expect(text).toContain("(func $shortest");
    expect(text).not.toMatch(/^ *;; include:/m);
  });

  it.each(kernels.map((k) => [k.wat, k] as const))("%s: the committed module is its assembly", async (_, kernel) => {
    const committed = readFileSync(new URL(`../../src/${kernel.module}`, import.meta.url), "utf8");
    expect(committed).toBe(kernelModuleText(kernel, await assembleKernel(kernel.wat)));
  });
});
