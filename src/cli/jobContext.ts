/** The jobs' context bound to the CLI: files from the file system, bootstrap threads, progress on a terminal. */
import { failure } from "../core/result.js";
import type { JobContext } from "../jobs/index.js";
import { describeCliIssue } from "./messages.js";
import { inWorkerThreads } from "./runtime/bootstrapThreads.js";
import type { CliIo } from "./runtime/io.js";
import { createProgress } from "./runtime/progress.js";

export function jobContext(io: CliIo): JobContext {
  return {
    read: async (name) => {
      const bytes = await (io.readSource !== undefined ? io.readSource(name) : io.readInput(name));
      return bytes.ok ? bytes : failure({ code: bytes.issues.code, message: describeCliIssue(bytes.issues) });
    },
    bootstrap: inWorkerThreads,
    progress: (label, total) => createProgress(io, label, total),
  };
}
