/**
 * The import graph of src/: data flows one way through the layers, the pure layers touch no file,
 * process or terminal, the generic numerics know nothing of the model, and no module imports itself
 * back through others (no cycles).
 */
import { readdirSync, readFileSync, statSync } from "node:fs";
import { dirname, join, relative, resolve } from "node:path";
import { describe, expect, it } from "vitest";

const src = resolve(new URL("../../src", import.meta.url).pathname);

function sourceFiles(folder: string): string[] {
  return readdirSync(folder).flatMap((name) => {
    const path = join(folder, name);
    if (statSync(path).isDirectory()) return sourceFiles(path);
    return name.endsWith(".ts") && !name.endsWith(".d.ts") ? [path] : [];
  });
}

/** Every module specifier a file imports (static, dynamic and type-only alike). */
function specifiers(text: string): string[] {
  // Examples in doc comments import too: comments are left out.
  const code = text.replace(/\/\*[\s\S]*?\*\//g, "").replace(/^\s*\/\/.*$/gm, "");
  const found = [...code.matchAll(/(?:from|import)\s*\(?\s*"([^"]+)"/g)].map((m) => m[1]!);
  return [...new Set(found)];
}

/** The code of a file without its comments. */
const codeOf = (text: string): string => text.replace(/\/\*[\s\S]*?\*\//g, "").replace(/^\s*\/\/.*$/gm, "");

const files = sourceFiles(src);
const code = new Map(files.map((file) => [relative(src, file), codeOf(readFileSync(file, "utf8"))]));
const graph = new Map<string, { local: string[]; external: string[] }>();
for (const file of files) {
  const all = specifiers(readFileSync(file, "utf8"));
  const local = all.filter((s) => s.startsWith(".")).map((s) => resolve(dirname(file), s).replace(/\.js$/, ".ts"));
  graph.set(relative(src, file), { local: local.map((p) => relative(src, p)), external: all.filter((s) => !s.startsWith(".")) });
}

/** The layers, bottom up: a module may import its own layer and those below it, never above. */
const layers = ["core", "input", "schema", "report", "options", "jobs", "cli", "index.ts"] as const;
const layerOf = (path: string): number => layers.indexOf(path.split("/")[0] as (typeof layers)[number]);

describe("the import graph of src/", () => {
  it("sees the imports (a known edge, and hundreds in all)", () => {
    expect(graph.get("cli/program.ts")?.local).toContain("cli/commands/solve.ts");
    expect(graph.get("report/charts/loadVega.ts")?.external).toContain("vega");
    expect([...graph.values()].reduce((n, { local }) => n + local.length, 0)).toBeGreaterThan(300);
  });

  it("resolves every local import to a file", () => {
    const missing = [...graph].flatMap(([file, { local }]) => local.filter((p) => !graph.has(p)).map((p) => `${file} -> ${p}`));
    expect(missing).toEqual([]);
  });

  it("has every file in a known layer", () => {
    expect(files.map((f) => relative(src, f)).filter((f) => layerOf(f) < 0)).toEqual([]);
  });

  it("imports only downward: core < input < schema < report < options < jobs < cli < index", () => {
    const upward = [...graph].flatMap(([file, { local }]) => local.filter((p) => layerOf(p) > layerOf(file)).map((p) => `${file} -> ${p}`));
    expect(upward).toEqual([]);
  });

  it("keeps the generic numerics free of the model (core/numerics imports only core/numerics)", () => {
    const leaks = [...graph]
      .filter(([file]) => file.startsWith("core/numerics/"))
      .flatMap(([file, { local }]) => local.filter((p) => !p.startsWith("core/numerics/")).map((p) => `${file} -> ${p}`));
    expect(leaks).toEqual([]);
  });

  it("keeps the pure layers away from files, processes, threads and terminals (node: built-ins only in cli)", () => {
    const impure = [...graph]
      .filter(([file]) => !file.startsWith("cli/"))
      .flatMap(([file, { external }]) => external.filter((s) => s.startsWith("node:")).map((s) => `${file} -> ${s}`));
    expect(impure).toEqual([]);
  });

  it("loads the command line's package (commander) only in cli, and none in the core", () => {
    const misplaced = [...graph].flatMap(([file, { external }]) =>
      external
        .filter((s) => (s === "commander" && !file.startsWith("cli/")) || (file.startsWith("core/") && !s.startsWith("node:")))
        .map((s) => `${file} -> ${s}`),
    );
    expect(misplaced).toEqual([]);
  });

  it("reaches the input layer and the jobs only through their index.ts from outside", () => {
    const throughSide = [...graph].flatMap(([file, { local }]) =>
      local
        .filter(
          (p) =>
            (p.startsWith("input/") && !file.startsWith("input/") && p !== "input/index.ts") ||
            (p.startsWith("jobs/") && file.startsWith("cli/") && p !== "jobs/index.ts"),
        )
        .map((p) => `${file} -> ${p}`),
    );
    expect(throughSide).toEqual([]);
  });

  it("uses no process globals outside cli (the input engines may use Buffer as a data type, for its native search)", () => {
    const globals = /\b(process\.|setImmediate|setTimeout|setInterval|__dirname|__filename|require\(|Buffer\b|console\.)/;
    const found = [...code]
      .filter(([file]) => !file.startsWith("cli/"))
      .flatMap(([file, text]) => {
        const hits = [...text.matchAll(new RegExp(globals, "g"))].map((m) => m[1]!);
        const allowed = file.startsWith("input/engines/") ? hits.filter((h) => h !== "Buffer") : hits;
        return allowed.map((h) => `${file}: ${h}`);
      });
    expect(found).toEqual([]);
  });

  it("has no cycles", () => {
    const cycles: string[] = [];
    const state = new Map<string, "open" | "done">();
    const stack: string[] = [];
    const visit = (file: string): void => {
      state.set(file, "open");
      stack.push(file);
      for (const next of graph.get(file)?.local ?? []) {
        if (state.get(next) === "open") cycles.push([...stack.slice(stack.indexOf(next)), next].join(" -> "));
        else if (!state.has(next)) visit(next);
      }
      stack.pop();
      state.set(file, "done");
    };
    for (const file of graph.keys()) if (!state.has(file)) visit(file);
    expect(cycles).toEqual([]);
  });
});
