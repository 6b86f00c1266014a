import { failure, success } from "../../src/core/result.js";
import type { CliIo } from "../../src/cli/runtime/io.js";
import { importVega } from "../../src/report/charts/loadVega.js";

/** An in-memory CliIo: files by name, captured stdout/stderr and written outputs. */
export function fakeIo(
  files: Record<string, string> = {},
  settings: Partial<Pick<CliIo, "stdoutIsTerminal" | "stdinIsTerminal" | "stderrIsTerminal" | "env" | "now">> = {},
) {
  const out: string[] = [];
  const err: string[] = [];
  const written = new Map<string, string>();
  const io: CliIo = {
    writeOut: (text) => void out.push(text),
    writeErr: (text) => void err.push(text),
    readInput: async (path) => {
      const text = files[path];
      return text === undefined
        ? failure({ code: "read-failed", path, reason: "no such file or directory" })
        : success(new TextEncoder().encode(text));
    },
    stdoutIsTerminal: settings.stdoutIsTerminal ?? false,
    stdinIsTerminal: settings.stdinIsTerminal ?? false,
    stderrIsTerminal: settings.stderrIsTerminal ?? false,
    now: settings.now ?? (() => 0),
    openOutput: (path) => {
      if (path?.startsWith("/unwritable/")) return failure({ code: "write-failed", path, reason: "permission denied" });
      // Bytes are copied as they come: a writer may reuse its buffer once a write resolves.
      const chunks: Buffer[] = [];
      return success({
        write: async (text) => void chunks.push(Buffer.from(typeof text === "string" || text instanceof Uint8Array ? text : text.join(""))),
        settle: async () => success(undefined),
        commit: async () => {
          const whole = Buffer.concat(chunks).toString("utf8");
          if (path === undefined) out.push(whole);
          else written.set(path, whole);
          return success(undefined);
        },
        abort: () => undefined,
      });
    },
    // Files are named by their path here: two paths name one file only when they are equal.
    identify: (path) => ({ key: path, device: path.startsWith("/dev/") }),
    env: settings.env ?? {},
    loadVega: importVega,
  };
  return { io, stdout: () => out.join(""), stderr: () => err.join(""), written };
}
