/**
 * The members of the WebAssembly JavaScript API that the row kernel (rowKernel.ts) uses. They are
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
    }
    class Instance {
      constructor(module: Module, imports?: Record<string, Record<string, unknown>>);
      readonly exports: Record<string, unknown>;
    }
  }
}

export {};
