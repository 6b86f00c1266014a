// Running one side of a case: wall time of the whole process (start-up included) around spawnSync,
// and its peak resident memory and page faults from /usr/bin/time (%M, the child's maximum RSS; %R,
// its minor page faults, those of the processes it waited for included), when present.
import { spawnSync } from "node:child_process";
import { closeSync, existsSync, openSync, readFileSync, readSync } from "node:fs";

const timeBinary = existsSync("/usr/bin/time") ? "/usr/bin/time" : null;
export const memorySource = timeBinary ? "/usr/bin/time -f %M (maximum resident set size)" : "not measured (no /usr/bin/time)";

/**
 * Runs argv (standard output to `stdoutPath`, /dev/null by default) and returns { seconds, rssMb, faults }.
 * Throws with the command's last stderr lines when it fails.
 */
export function measure(argv, { stdoutPath = "/dev/null", env = process.env, stdinPath = null } = {}) {
  const out = openSync(stdoutPath, "w");
  const input = stdinPath === null ? "ignore" : openSync(stdinPath, "r");
  const [command, args] = timeBinary
    ? [timeBinary, ["-f", "BENCH_MAX_RSS_KB %M BENCH_MINOR_FAULTS %R", ...argv]]
    : [argv[0], argv.slice(1)];
  const started = process.hrtime.bigint();
  const result = spawnSync(command, args, { stdio: [input, out, "pipe"], env, encoding: "utf8", maxBuffer: 1 << 26 });
  const seconds = Number(process.hrtime.bigint() - started) / 1e9;
  closeSync(out);
  if (typeof input === "number") closeSync(input);
  if (result.error) throw new Error(`${argv.join(" ")}: ${result.error.message}`);
  if (result.status !== 0) {
    throw new Error(`${argv.join(" ")} exited with ${result.status}:\n${result.stderr.split("\n").slice(-15).join("\n")}`);
  }
  const matches = [...result.stderr.matchAll(/BENCH_MAX_RSS_KB (\d+)/g)];
  const rssMb = matches.length > 0 ? Number(matches.at(-1)[1]) / 1024 : null;
  const faults = [...result.stderr.matchAll(/BENCH_MINOR_FAULTS (\d+)/g)];
  return { seconds, rssMb, faults: faults.length > 0 ? Number(faults.at(-1)[1]) : null };
}

/** Lines of a (possibly huge) text file, read in 16 MiB chunks. */
export function* fileLines(path) {
  const fd = openSync(path, "r");
  const buffer = Buffer.alloc(1 << 24);
  let rest = "";
  try {
    for (;;) {
      const bytesRead = readSync(fd, buffer, 0, buffer.length, null);
      if (bytesRead === 0) break;
      const text = rest + buffer.toString("utf8", 0, bytesRead);
      const lines = text.split("\n");
      rest = lines.pop();
      yield* lines;
    }
    if (rest !== "") yield rest;
  } finally {
    closeSync(fd);
  }
}

export const readJson = (path) => JSON.parse(readFileSync(path, "utf8"));
