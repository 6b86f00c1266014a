/**
 * Every example in the README runs as written: each command of its `sh` blocks (backslash
 * continuations joined, comment lines skipped) and each inline `npx betabound ...` is run with the
 * built executable (dist/cli.cjs, made by `npm run build`) from a scratch copy of the files it
 * names, so its outputs land there and the repository is left as it was. A command exits 0 unless
 * the README writes `# exit N` after it. The commands that cannot run here are listed below with
 * the reason. The library's `ts` blocks run against the built library (dist/), their types
 * stripped by esbuild. The config files the README shows are the committed ones.
 */
import { spawnSync } from "node:child_process";
import {
  cpSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  rmSync,
  statSync,
  symlinkSync,
  writeFileSync,
} from "node:fs";
import { tmpdir } from "node:os";
import { dirname, join } from "node:path";
import { pathToFileURL } from "node:url";
import { transformSync } from "esbuild";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

const root = new URL("../../", import.meta.url).pathname;
const cli = join(root, "dist/cli.cjs");
const readme = readFileSync(join(root, "README.md"), "utf8");

/** Commands of the README's sh blocks that are not run here, and why. */
const notRun: Record<string, string> = {
  "npm ci && npm run demo": "installs from the registry; the demo script is checked below to be one of the commands run here",
  "npm ci && npm test": "the test suite itself",
  "30 6 * * 1-5": "a crontab entry for a server's folder (/srv/risk), not a command",
};

interface Example {
  readonly command: string;
  readonly exit: number;
}

/** The contents of the README's fenced blocks of `language`. */
function blocks(text: string, language: string): string[] {
  return [...text.matchAll(new RegExp(`^\`\`\`${language}\n([\\s\\S]*?)^\`\`\``, "gm"))].map((m) => m[1]!);
}

/** The logical lines of the README's sh blocks, continuations joined, comments and blanks left out. */
function shCommands(text: string): string[] {
  const commands: string[] = [];
  let block: string | null = null;
  let pending = "";
  for (const line of text.split("\n")) {
    const fence = /^\s*```(\w*)\s*$/.exec(line);
    if (fence !== null) {
      block = block === null ? (fence[1] ?? "") : null;
      continue;
    }
    if (block !== "sh") continue;
    const trimmed = line.trim();
    if (pending === "" && (trimmed === "" || trimmed.startsWith("#"))) continue;
    if (trimmed.endsWith("\\")) {
      pending += `${trimmed.slice(0, -1).trimEnd()} `;
      continue;
    }
    commands.push(pending + trimmed);
    pending = "";
  }
  return commands;
}

/** Inline `npx betabound ...` spans of the prose (a span may wrap across lines). */
function inlineCommands(text: string): string[] {
  return [...text.matchAll(/`(npx betabound [^`]+)`/g)].map((m) => m[1]!.replace(/\s+/g, " "));
}

const excluded = (command: string): boolean => Object.keys(notRun).some((prefix) => command.startsWith(prefix));

const allCommands = [...shCommands(readme), ...inlineCommands(readme)];
const examples: Example[] = allCommands
  .filter((command) => !excluded(command))
  .map((command) => {
    const annotation = /\s+#\s*exit (\d+)\s*$/.exec(command);
    return annotation === null ? { command, exit: 0 } : { command: command.slice(0, annotation.index), exit: Number(annotation[1]) };
  });

/** The command with each `betabound` (or `npx betabound`) in command position run through node and dist/cli.cjs. */
const runnable = (command: string): string =>
  command.replace(/(^|[|;&(]\s*)(?:npx )?betabound(?= |$)/g, (_, before: string) => `${before}"${process.execPath}" "${cli}"`);

/** The repository files a command names (under examples/ or test/fixtures/; PATH:COLUMN included). */
const namedFiles = (command: string): string[] =>
  [...command.matchAll(/(?:^|[\s"'=])((?:examples|test\/fixtures)\/[^\s"':]+)/g)].map((m) => m[1]!);

/** The outputs a command writes into its working folder: --output, --chart, --report and `>` redirections. */
const namedOutputs = (command: string): string[] =>
  [...command.matchAll(/(?:--output|--chart|--report|>)\s+([^\s|;&]+)/g)].map((m) => m[1]!).filter((p) => !p.startsWith("/dev/"));

/** Every file under `folder`, with its size and modification time, to see that nothing changed. */
function listing(folder: string): string[] {
  return readdirSync(folder, { recursive: true, encoding: "utf8" })
    .map((name) => {
      const stat = statSync(join(folder, name));
      return `${name} ${stat.size} ${stat.mtimeMs}`;
    })
    .sort();
}

let scratch = "";
let before: string[] = [];
beforeAll(() => {
  expect(existsSync(cli), "dist/cli.cjs is missing: run npm run build").toBe(true);
  scratch = mkdtempSync(join(tmpdir(), "betabound-readme-"));
  cpSync(join(root, "examples"), join(scratch, "examples"), { recursive: true });
  // Files to read (an output under examples/ or test/fixtures/ is made by its command, in the copy).
  for (const file of examples.flatMap((e) => namedFiles(e.command)).filter((f) => existsSync(join(root, f)))) {
    mkdirSync(dirname(join(scratch, file)), { recursive: true });
    cpSync(join(root, file), join(scratch, file));
  }
  before = listing(join(root, "examples"));
});

const scratchFolders: string[] = [];
afterAll(() => {
  // Every output went to the scratch copy: the repository's examples are as they were.
  expect(listing(join(root, "examples"))).toEqual(before);
  for (const folder of [scratch, ...scratchFolders]) if (folder !== "") rmSync(folder, { recursive: true, force: true });
});

describe("the README's examples", () => {
  it("are found, and every sh command either runs here or is listed with its reason", () => {
    // A command with continuations, one meant to fail, and the inline npx example are among them.
    expect(examples.map((e) => e.command)).toContain(
      'betabound solve examples/desks/desk-a.csv --low "Stillwater Low Vol" --high "Kestrel High Beta" --rf "Cash Rate" --units percent --format json',
    );
    expect(examples.filter((e) => e.exit !== 0).length).toBeGreaterThan(0);
    expect(examples.filter((e) => e.command.startsWith("npx betabound ")).length).toBeGreaterThan(0);
    for (const prefix of Object.keys(notRun))
      expect(
        allCommands.some((c) => c.startsWith(prefix)),
        prefix,
      ).toBe(true);
    for (const { command } of examples) expect(command, "not a betabound command").toMatch(/(^|\| )(npx )?betabound /);
  });

  it.each(examples.map((e) => [e.command, e.exit] as const))(
    "%s (exit %i)",
    (command, exit) => {
      const result = spawnSync("sh", ["-c", runnable(command)], {
        cwd: scratch,
        encoding: "utf8",
        env: { ...process.env, NO_COLOR: "1" },
        maxBuffer: 1 << 28,
      });
      expect(result.status, result.stderr).toBe(exit);
      if (exit === 0) {
        expect(result.stderr).not.toMatch(/^error:/m);
        for (const output of namedOutputs(command)) expect(statSync(join(scratch, output)).size, output).toBeGreaterThan(0);
      } else {
        // A failing example shows what it says: its first error line is in the README as printed.
        const said = result.stderr.split("\n").find((line) => line.startsWith("error:"));
        expect(said, result.stderr).toBeDefined();
        expect(readme).toContain(said);
      }
    },
    120_000,
  );

  it.each(blocks(readme, "ts").map((code, i) => [i + 1, code] as const))(
    "library example %i runs against dist/",
    (i, code) => {
      const library = (entry: string) => JSON.stringify(pathToFileURL(join(root, "dist", entry)).href);
      const script = transformSync(code, { loader: "ts", format: "esm" })
        .code.replace(/from "betabound\/core"/g, `from ${library("core.js")}`)
        .replace(/from "betabound"/g, `from ${library("index.js")}`);
      expect(script).not.toMatch(/from "betabound/);
      const file = join(scratch, `library-example-${i}.mjs`);
      writeFileSync(file, script);
      const result = spawnSync(process.execPath, [file], { cwd: scratch, encoding: "utf8" });
      expect(result.status, result.stderr).toBe(0);
      expect(result.stderr).toBe("");
      expect(result.stdout.length).toBeGreaterThan(0);
    },
    60_000,
  );

  it("use files that examples/README.md's commands regenerate byte for byte", () => {
    const made = blocks(readFileSync(join(root, "examples/README.md"), "utf8"), "sh").find((b) => b.includes("generate.mjs"));
    expect(made).toBeDefined();
    const copy = mkdtempSync(join(tmpdir(), "betabound-examples-"));
    scratchFolders.push(copy);
    cpSync(join(root, "examples"), join(copy, "examples"), { recursive: true });
    symlinkSync(join(root, "dist"), join(copy, "dist"));
    const generated = ["desks/desk-a.csv", "desks/desk-b.csv", "funds/stillwater.csv", "funds/kestrel.csv"];
    for (const file of generated) writeFileSync(join(copy, "examples", file), "");
    const result = spawnSync("sh", ["-e", "-c", made!], { cwd: copy, encoding: "utf8" });
    expect(result.status, result.stderr).toBe(0);
    for (const file of generated)
      expect(readFileSync(join(copy, "examples", file), "utf8"), file).toBe(readFileSync(join(root, "examples", file), "utf8"));
  });

  it("show the config files as committed", () => {
    // A paragraph naming the file and ending in a colon, then the file in a json block.
    const shown = [...readme.matchAll(/`(examples\/[^`]+\.json)`(?:[^\n]|\n(?!\n))*:\n\n```json\n([\s\S]*?)```/g)];
    expect(shown.map((m) => m[1])).toEqual(["examples/nightly.json", "examples/desks/shared.json"]);
    for (const [, path, text] of shown) expect(text, path).toBe(readFileSync(join(root, path!), "utf8"));
  });

  it("include the demo the set-up line runs", () => {
    const scripts = (JSON.parse(readFileSync(join(root, "package.json"), "utf8")) as { scripts: Record<string, string> }).scripts;
    const demo = scripts.demo?.replace(/^node dist\/cli\.cjs /, "betabound ");
    expect(readme).toContain("npm ci && npm run demo");
    expect(examples.map((e) => e.command)).toContain(demo);
  });

  it("say that betabound with no arguments prints the help and exits 1", () => {
    expect(readme).toContain("`betabound` with no arguments prints the help (exit 1)");
    const result = spawnSync(process.execPath, [cli], { encoding: "utf8", env: { ...process.env, NO_COLOR: "1" } });
    expect(result.status).toBe(1);
    expect(result.stdout).toBe("");
    expect(result.stderr).toMatch(/^Usage: betabound \[options\] \[command\]/);
  });
});
