declare const __BETABOUND_VERSION__: string | undefined;

/** The package version, injected by the build (scripts/build.mjs); "development" when run from source. */
export const version: string = typeof __BETABOUND_VERSION__ === "string" ? __BETABOUND_VERSION__ : "development";

/** What every document names as its maker. */
export const tool = { name: "betabound", version } as const;
