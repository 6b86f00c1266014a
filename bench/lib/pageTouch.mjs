// A floor of this machine: the first touch of fresh memory. Writes one element of each 4 KiB page of a
// new 64 MiB Float64Array (zero-filled memory the system maps page by page as it is first written) and
// prints {"usPerFault": ..., "faults": ...}: microseconds per page fault, the faults counted by the
// process's own resource usage (none counted: usPerFault is null, and bench/run.mjs leaves the run out).
// Run by bench/run.mjs in a process of its own, alone: a real run's threads may fault side by side.
const bytes = 64 << 20;
const array = new Float64Array(bytes / 8);
const faultsBefore = process.resourceUsage().minorPageFault;
const started = process.hrtime.bigint();
for (let i = 0; i < array.length; i += 4096 / 8) array[i] = 1;
const microseconds = Number(process.hrtime.bigint() - started) / 1e3;
const faults = process.resourceUsage().minorPageFault - faultsBefore;
process.stdout.write(
  `${JSON.stringify({ usPerFault: faults > 0 ? microseconds / faults : null, faults, usPerMiB: microseconds / (bytes / 2 ** 20) })}\n`,
);
