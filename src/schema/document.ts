/**
 * The type of a document an output schema describes, as the code builds it: `z.output` of the schema,
 * read-only all the way down (the core's values are read-only, and a document is never changed once
 * built). Renderers are typed with it, so the JSON they write and the schema cannot drift apart.
 */
export type Document<T> = T extends (infer U)[]
  ? readonly Document<U>[]
  : T extends readonly (infer U)[]
    ? readonly Document<U>[]
    : T extends object
      ? { readonly [K in keyof T]: Document<T[K]> }
      : T;
