/**
 * A run's messages on stderr. A warning or error from reading a file is written once per run however
 * many pairs were read from that file, and whatever the output (a text report on the terminal lists a
 * warning too, but a reading message is about the file, not one report); the rest as each command decides.
 */
import type { JobMessage } from "../jobs/index.js";
import type { CliIo } from "./runtime/io.js";

/** Writes messages to stderr, remembering the reading messages already written in `seen`. */
export function writeMessages(io: CliIo, messages: readonly JobMessage[], seen: Set<string>, quietReport = false): void {
  for (const message of messages) {
    if (message.reading === true) {
      const key = `${message.severity}: ${message.text}`;
      if (seen.has(key)) continue;
      seen.add(key);
    } else if (quietReport) continue;
    io.writeErr(`${message.severity}: ${message.text}\n`);
  }
}
