/**
 * The CLI's file access (src/cli/runtime/files.ts): reads, large reads into the row kernel's memory,
 * large files opened to be read by position, the size limit.
 */
import { mkdtempSync, readFileSync, truncateSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { Readable } from "node:stream";
import { describe, expect, it } from "vitest";
import { readInputBytes, readInputSource, readStream } from "../../src/cli/runtime/files.js";
import { rowKernelFor, WINDOW_FROM } from "../../src/input/engines/rowKernel.js";

const scratch = mkdtempSync(join(tmpdir(), "betabound-files-"));

describe("readInputBytes", () => {
  it("reads a small file whole", async () => {
    const path = join(scratch, "small.csv");
    writeFileSync(path, "Date,A\n2020-01-31,1\n");
    const read = await readInputBytes(path);
    if (!read.ok) throw new Error("read failed");
    expect(Buffer.from(read.value).toString()).toBe("Date,A\n2020-01-31,1\n");
  });

  it("reads a large file whole, into the row kernel's memory (read there in place)", async () => {
    const path = join(scratch, "large.csv");
    const row = "2020-01-31,0.012345,-0.5\n";
    const text = `Date,A,B\n${row.repeat(Math.ceil((17 << 20) / row.length))}`;
    writeFileSync(path, text);
    const read = await readInputBytes(path);
    if (!read.ok) throw new Error("read failed");
    expect(read.value.length).toBe(text.length);
    expect(Buffer.from(read.value.buffer, read.value.byteOffset, read.value.length).equals(readFileSync(path))).toBe(true);
    // Above the size the kernel copies, it only takes bytes that are already in its memory.
    expect(rowKernelFor(read.value)).not.toBeNull();
  });

  it("reads a device as a stream, stopping at the first chunk holding a NUL byte (/dev/zero ends at once)", async () => {
    const read = await readInputBytes("/dev/zero");
    if (!read.ok) throw new Error("read failed");
    expect(read.value.length).toBeGreaterThan(0);
    expect(read.value.length).toBeLessThanOrEqual(1 << 20);
    const limited = await readInputBytes("/dev/urandom", 1000);
    expect(limited.ok ? "read" : limited.issues.code).toBe("input-too-large");
  });

  it("says which file could not be read, and why", async () => {
    const read = await readInputBytes(join(scratch, "missing.csv"));
    expect(read.ok).toBe(false);
    if (!read.ok) expect(read.issues).toMatchObject({ code: "read-failed", path: join(scratch, "missing.csv") });
  });
});

describe("readInputSource", () => {
  const row = "2020-01-31,0.012345,-0.5\n";
  const largeText = `Date,A,B\n${row.repeat(Math.ceil((17 << 20) / row.length))}`;

  it("reads a small file whole, and opens a large one to be read by position (closed by its reader)", async () => {
    const small = join(scratch, "source-small.csv");
    writeFileSync(small, "Date,A\n2020-01-31,1\n");
    const whole = await readInputSource(small);
    expect(whole.ok && whole.value instanceof Uint8Array).toBe(true);
    const path = join(scratch, "source-large.csv");
    writeFileSync(path, largeText);
    const opened = await readInputSource(path);
    if (!opened.ok || opened.value instanceof Uint8Array) throw new Error("expected a file read by position");
    const file = opened.value;
    expect(file.size).toBe(largeText.length);
    const piece = new Uint8Array(row.length);
    expect(file.read(9, piece, 0, piece.length)).toBe(row.length);
    expect(Buffer.from(piece).toString()).toBe(row);
    expect(file.failure?.()).toBeNull();
    file.close();
  });

  it("reads a file of up to WINDOW_FROM bytes whole, and a byte longer one by position", async () => {
    const at = join(scratch, "source-at-limit.csv");
    const header = "Date,A,B\n";
    const rows = row.repeat(Math.ceil(WINDOW_FROM / row.length));
    writeFileSync(at, (header + rows).slice(0, WINDOW_FROM));
    const whole = await readInputSource(at);
    expect(whole.ok && whole.value instanceof Uint8Array && whole.value.length === WINDOW_FROM).toBe(true);
    const over = join(scratch, "source-over-limit.csv");
    writeFileSync(over, (header + rows).slice(0, WINDOW_FROM + 1));
    const opened = await readInputSource(over);
    if (!opened.ok || opened.value instanceof Uint8Array) throw new Error("expected a file read by position");
    expect(opened.value.size).toBe(WINDOW_FROM + 1);
    opened.value.close();
  });

  it("says why, when a file read by position became shorter meanwhile", async () => {
    const path = join(scratch, "source-shrinks.csv");
    writeFileSync(path, largeText);
    const opened = await readInputSource(path);
    if (!opened.ok || opened.value instanceof Uint8Array) throw new Error("expected a file read by position");
    truncateSync(path, 1000);
    expect(opened.value.read(5000, new Uint8Array(10), 0, 10)).toBe(0);
    expect(opened.value.failure?.()).toEqual({
      code: "read-failed",
      message: `cannot read '${path}': the file became shorter while it was read; check the path and its permissions`,
    });
    opened.value.close();
  });

  it("says which file could not be opened, and why", async () => {
    const read = await readInputSource(join(scratch, "missing.csv"));
    expect(read.ok).toBe(false);
    if (!read.ok) expect(read.issues).toMatchObject({ code: "read-failed", path: join(scratch, "missing.csv") });
  });
});

describe("the input size limit", () => {
  it("refuses a file over the limit before reading it, naming its size and the limit", async () => {
    const path = join(scratch, "over.csv");
    const text = "Date,A\n2020-01-31,1\n";
    writeFileSync(path, text);
    const read = await readInputBytes(path, 10);
    expect(read.ok).toBe(false);
    if (!read.ok) expect(read.issues).toEqual({ code: "input-too-large", path, size: text.length, limit: 10 });
  });

  it("stops reading standard input as soon as it passes the limit, and refuses it", async () => {
    let pulled = 0;
    const endless = Readable.from(
      (function* () {
        for (;;) {
          pulled += 1;
          yield Buffer.alloc(1000, 48);
        }
      })(),
    );
    const read = await readStream(endless, 4500, "<stdin>");
    expect(read.ok).toBe(false);
    if (!read.ok) expect(read.issues).toEqual({ code: "input-too-large", path: "<stdin>", size: null, limit: 4500 });
    expect(pulled).toBeLessThan(10);
    const small = await readStream(Readable.from([Buffer.from("Date,A\n")]), 7, "<stdin>");
    expect(small.ok && Buffer.from(small.value).toString()).toBe("Date,A\n");
  });

  it("reads a file exactly at the limit", async () => {
    const path = join(scratch, "at.csv");
    writeFileSync(path, "Date,A\n");
    expect((await readInputBytes(path, 7)).ok).toBe(true);
  });
});
