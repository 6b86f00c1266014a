/**
 * The members of the WebAssembly JavaScript API that the kernels (rowKernel.ts, seriesKernel.ts,
 * csvRowsKernel.ts) use. They are
 * declared by TypeScript's DOM library only, which this Node project does not load.
 */
declare global {
  namespace WebAssembly {
    class Module {
      constructor(bytes: Uint8Array);
    }
    class Memory {
      constructor(descriptor: { initial: number; maximum?: number });
      readonly buffer: ArrayBuffer;
      /** Adds `pages` pages of 64 KiB (the old buffer is then detached); returns the old size in pages. */
      grow(pages: number): number;
    }
    class Instance {
      constructor(module: Module, imports?: Record<string, Record<string, unknown>>);
      readonly exports: Record<string, unknown>;
    }
  }
}

export {};
