/**
 * A progress line on standard error for long runs: only when stderr is a terminal, and only once the
 * work has taken more than a second, so short runs and pipelines see nothing.
 */
import type { Progress } from "../../jobs/index.js";
import type { CliIo } from "./io.js";

const delayMs = 1000;
const width = 30;

/** Lets the event loop run (and a written line reach the terminal) before the work goes on. */
const yieldToEventLoop = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));

export function createProgress(io: CliIo, label: string, total: number): Progress {
  const started = io.now();
  let shown = false;
  let lastPercent = -1;
  return {
    update(done) {
      if (!io.stderrIsTerminal || io.now() - started < delayMs) return yieldToEventLoop();
      const percent = Math.floor((100 * done) / total);
      if (percent === lastPercent) return yieldToEventLoop();
      lastPercent = percent;
      const filled = Math.round((width * done) / total);
      io.writeErr(`\r${label} [${"#".repeat(filled)}${".".repeat(width - filled)}] ${String(percent).padStart(3)}%`);
      shown = true;
      return yieldToEventLoop();
    },
    finish() {
      if (shown) io.writeErr(`\r${" ".repeat(label.length + width + 8)}\r`);
    },
  };
}
