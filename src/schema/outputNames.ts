/** Names of the machine-readable outputs, for `betabound schema NAME` (kept free of zod: cheap to import). */
export const outputNames = ["solve", "solve-record", "implied", "roll-record"] as const;
