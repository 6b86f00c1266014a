/**
 * The output path (src/cli/runtime/output.ts) on a real temporary folder, with failures injected
 * through its file operations: every write checked, the previous file intact and no temporary file
 * left whatever fails, modes kept, links followed, special files written in place, back-pressure.
 */
import { execFileSync } from "node:child_process";
import * as fs from "node:fs";
import { tmpdir } from "node:os";
import { join, relative as relativePath } from "node:path";
import { describe, expect, it } from "vitest";
import {
  type FileOps,
  namesFolder,
  type OutputStream,
  openOutput,
  removeTemporaries,
  resolveTarget,
} from "../../src/cli/runtime/output.js";

const scratch = fs.mkdtempSync(join(tmpdir(), "betabound-output-"));
const noStdout: OutputStream = { write: () => true, once: () => undefined };

function folderWith(previous: string | null): { dir: string; path: string } {
  const dir = fs.mkdtempSync(join(scratch, "case-"));
  const path = join(dir, "out.csv");
  if (previous !== null) fs.writeFileSync(path, previous);
  return { dir, path };
}

/** node:fs whose writes fail with `code` once `budget` bytes have been written (a full disk, EIO). */
function failingDisk(budget: number, code: string): FileOps {
  let left = budget;
  return {
    ...fs,
    writeSync: ((fd: number, bytes: Uint8Array, offset: number, length: number) => {
      if (left <= 0) throw Object.assign(new Error(`${code}: injected`), { code });
      const n = Math.min(length, left);
      left -= n;
      return fs.writeSync(fd, bytes, offset, n);
    }) as FileOps["writeSync"],
  };
}

async function writeAll(path: string, pieces: readonly (string | readonly string[] | Uint8Array)[], ops: FileOps = fs) {
  const opened = openOutput(path, noStdout, ops);
  if (!opened.ok) throw new Error("open failed");
  for (const piece of pieces) await opened.value.write(piece);
  return opened.value.commit();
}

describe("a regular file", () => {
  it("is replaced whole on commit, with no temporary file left", async () => {
    const { dir, path } = folderWith("previous\n");
    const committed = await writeAll(path, ["a,b\n", "1,2\n"]);
    expect(committed.ok).toBe(true);
    expect(fs.readFileSync(path, "utf8")).toBe("a,b\n1,2\n");
    expect(fs.readdirSync(dir)).toEqual(["out.csv"]);
  });

  it("takes bytes as well as text, in the order given", async () => {
    const { path } = folderWith("previous\n");
    const committed = await writeAll(path, ["a,b\n", new TextEncoder().encode("1,2\n"), "3,4\n"]);
    expect(committed.ok).toBe(true);
    expect(fs.readFileSync(path, "utf8")).toBe("a,b\n1,2\n3,4\n");
  });

  it("writes a long text as its UTF-8 bytes (Buffer.from's), however its characters fall across the pieces it is encoded in", async () => {
    const { path } = folderWith(null);
    // Pieces of 256 KiB: two-, three- and four-byte characters (a surrogate pair) and a lone surrogate
    // (written as U+FFFD, as Buffer.from does) at every offset around the pieces' ends.
    const unit = "a\u00e9\u20ac\ud83d\ude00\ud800z";
    const text = `${"x".repeat((1 << 18) - 5)}${unit.repeat(400_000)}`;
    expect((await writeAll(path, [text, "end\n"])).ok).toBe(true);
    expect(fs.readFileSync(path).equals(Buffer.concat([Buffer.from(text), Buffer.from("end\n")]))).toBe(true);
  });

  it("writes text in pieces as each piece's UTF-8 bytes in order, pieces and characters across the buffer's ends", async () => {
    const { path } = folderWith("previous\n");
    const unit = "a\u00e9\u20ac\ud83d\ude00\ud800z";
    // Many short pieces that fill the reused buffer (256 KiB) unevenly, empty ones, a piece longer than
    // the buffer, and a surrogate pair split across two pieces (each half alone is a lone surrogate,
    // written as U+FFFD, as Buffer.from writes each piece).
    const pieces = [
      ...Array.from({ length: 30_000 }, (_, i) => (i % 7 === 0 ? "" : unit.repeat(i % 5) + String(i))),
      "y".repeat(700_000),
      "\ud83d",
      "\ude00",
      ...Array.from({ length: 1000 }, (_, i) => `${"z".repeat(i)}\n`),
    ];
    expect((await writeAll(path, [pieces, "end\n"])).ok).toBe(true);
    const expected = Buffer.concat([...pieces, "end\n"].map((piece) => Buffer.from(piece)));
    expect(fs.readFileSync(path).equals(expected)).toBe(true);
    expect(expected.length).toBeGreaterThan(4 << 18);
  });

  it("fails on ENOSPC in the middle of pieces with the previous file intact", async () => {
    const { dir, path } = folderWith("previous\n");
    const pieces = Array.from({ length: 5000 }, (_, i) => `${i},${"x".repeat(100)}\n`);
    const committed = await writeAll(path, [pieces], failingDisk(300_000, "ENOSPC"));
    expect(committed.ok).toBe(false);
    expect(fs.readFileSync(path, "utf8")).toBe("previous\n");
    expect(fs.readdirSync(dir)).toEqual(["out.csv"]);
  });

  it("is untouched until commit: the output goes to a temporary file beside it", async () => {
    const { dir, path } = folderWith("previous\n");
    const opened = openOutput(path, noStdout);
    if (!opened.ok) throw new Error("open failed");
    await opened.value.write("new\n");
    expect(fs.readFileSync(path, "utf8")).toBe("previous\n");
    expect(fs.readdirSync(dir)).toHaveLength(2);
    opened.value.abort();
    expect(fs.readdirSync(dir)).toEqual(["out.csv"]);
    expect(fs.readFileSync(path, "utf8")).toBe("previous\n");
  });

  for (const code of ["ENOSPC", "EIO", "EDQUOT"]) {
    it(`fails on ${code} mid-way with the previous file intact and no temporary file`, async () => {
      const { dir, path } = folderWith("previous\n");
      const committed = await writeAll(path, ["x".repeat(1000), "y".repeat(1000)], failingDisk(1500, code));
      expect(committed.ok).toBe(false);
      if (!committed.ok) expect(committed.issues).toMatchObject({ code: "write-failed", path });
      expect(fs.readFileSync(path, "utf8")).toBe("previous\n");
      expect(fs.readdirSync(dir)).toEqual(["out.csv"]);
    });
  }

  it("completes short writes (a write that takes fewer bytes than given is not an error)", async () => {
    const { path } = folderWith(null);
    const trickle: FileOps = {
      ...fs,
      writeSync: ((fd: number, bytes: Uint8Array, offset: number, length: number) =>
        fs.writeSync(fd, bytes, offset, Math.min(length, 7))) as FileOps["writeSync"],
    };
    const text = "date,low,high\n2020-01-31,0.01,0.02\n".repeat(20);
    expect((await writeAll(path, [text], trickle)).ok).toBe(true);
    expect(fs.readFileSync(path, "utf8")).toBe(text);
  });

  it("fails when the flush to the disk fails, leaving the previous file", async () => {
    const { dir, path } = folderWith("previous\n");
    const noSync: FileOps = {
      ...fs,
      fsyncSync: () => {
        throw Object.assign(new Error("EIO: injected"), { code: "EIO" });
      },
    };
    expect((await writeAll(path, ["new\n"], noSync)).ok).toBe(false);
    expect(fs.readFileSync(path, "utf8")).toBe("previous\n");
    expect(fs.readdirSync(dir)).toEqual(["out.csv"]);
  });

  // 65 pieces of 1 MiB: more than the 64 MiB after which the file is flushed in the background.
  const large = Array.from({ length: 65 }, () => new Uint8Array(1 << 20).fill(49));

  it("flushes a large file to the disk in the background as it is written, and commits it whole", async () => {
    const { path } = folderWith("previous\n");
    let flushes = 0;
    const counting: FileOps = {
      ...fs,
      fdatasync: ((fd: number, done: (error: NodeJS.ErrnoException | null) => void) => {
        flushes += 1;
        fs.fdatasync(fd, done);
      }) as FileOps["fdatasync"],
    };
    expect((await writeAll(path, large, counting)).ok).toBe(true);
    expect(flushes).toBe(1);
    expect(fs.statSync(path).size).toBe(65 << 20);
  });

  it("fails when a background flush fails, leaving the previous file", async () => {
    const { dir, path } = folderWith("previous\n");
    const failingFlush: FileOps = {
      ...fs,
      fdatasync: ((_fd: number, done: (error: NodeJS.ErrnoException | null) => void) => {
        setImmediate(() => done(Object.assign(new Error("EIO: injected"), { code: "EIO" })));
      }) as FileOps["fdatasync"],
    };
    const result = await writeAll(path, large, failingFlush);
    expect(result.ok).toBe(false);
    expect(fs.readFileSync(path, "utf8")).toBe("previous\n");
    expect(fs.readdirSync(dir)).toEqual(["out.csv"]);
  });

  it("keeps the mode of the file it replaces", async () => {
    const { path } = folderWith("previous\n");
    fs.chmodSync(path, 0o640);
    expect((await writeAll(path, ["new\n"])).ok).toBe(true);
    expect(fs.statSync(path).mode & 0o7777).toBe(0o640);
  });

  it("follows a symbolic link: the link's target is replaced and the link kept", async () => {
    const { dir, path } = folderWith("previous\n");
    const link = join(dir, "latest.csv");
    fs.symlinkSync("out.csv", link);
    expect((await writeAll(link, ["new\n"])).ok).toBe(true);
    expect(fs.lstatSync(link).isSymbolicLink()).toBe(true);
    expect(fs.readFileSync(path, "utf8")).toBe("new\n");
  });

  it("creates the target of a dangling link, keeping the link", async () => {
    const { dir } = folderWith(null);
    const link = join(dir, "latest.csv");
    fs.symlinkSync("made.csv", link);
    expect((await writeAll(link, ["new\n"])).ok).toBe(true);
    expect(fs.lstatSync(link).isSymbolicLink()).toBe(true);
    expect(fs.readFileSync(join(dir, "made.csv"), "utf8")).toBe("new\n");
  });

  it("says why a folder that does not exist cannot be written, creating nothing", async () => {
    const { dir } = folderWith(null);
    const opened = openOutput(join(dir, "missing", "out.csv"), noStdout);
    expect(opened.ok).toBe(false);
    if (!opened.ok) expect(opened.issues).toMatchObject({ code: "write-failed", reason: "no such file or directory" });
    expect(fs.readdirSync(dir)).toEqual([]);
  });

  it("removes the temporary files in the making when told to (as on a signal)", async () => {
    const { dir, path } = folderWith("previous\n");
    const opened = openOutput(path, noStdout);
    if (!opened.ok) throw new Error("open failed");
    await opened.value.write("partial");
    removeTemporaries();
    expect(fs.readdirSync(dir)).toEqual(["out.csv"]);
    expect(fs.readFileSync(path, "utf8")).toBe("previous\n");
  });
});

describe("paths", () => {
  it("a path ending in '/', '.' or '..' names a folder, never an output file", () => {
    for (const folder of ["", "out.csv/", "out.csv/.", "out.csv//", "a/..", ".", ".."]) expect(namesFolder(folder), folder).toBe(true);
    for (const file of ["out.csv", "a/.out", "a/..b", "./out.csv", "../out.csv"]) expect(namesFolder(file), file).toBe(false);
    const { dir } = folderWith(null);
    const opened = openOutput(join(dir, "out.csv/"), noStdout);
    expect(opened.ok).toBe(false);
    expect(fs.readdirSync(dir)).toEqual([]);
  });

  it("an existing folder is refused at opening, before anything is written or renamed", () => {
    const { dir } = folderWith(null);
    fs.mkdirSync(join(dir, "taken"));
    const opened = openOutput(join(dir, "taken"), noStdout);
    expect(opened.ok).toBe(false);
    if (!opened.ok) expect(opened.issues).toMatchObject({ code: "write-failed", reason: "it is a folder, not a file" });
    expect(fs.readdirSync(dir)).toEqual(["taken"]);
  });

  it("a regular file under /dev (/dev/shm) is replaced as any other, not appended to", async (context) => {
    if (!fs.existsSync("/dev/shm")) context.skip();
    const path = join(fs.mkdtempSync("/dev/shm/betabound-"), "out.json");
    fs.writeFileSync(path, "previous\n");
    expect(resolveTarget(path).special).toBe(false);
    expect((await writeAll(path, ["new\n"])).ok).toBe(true);
    expect(fs.readFileSync(path, "utf8")).toBe("new\n");
    fs.rmSync(join(path, ".."), { recursive: true });
  });

  it("a link that points to itself is refused, not replaced by a file", () => {
    const { dir } = folderWith(null);
    const loop = join(dir, "loop.csv");
    fs.symlinkSync("loop.csv", loop);
    const opened = openOutput(loop, noStdout);
    expect(opened.ok).toBe(false);
    if (!opened.ok) expect(opened.issues).toMatchObject({ code: "write-failed", reason: "too many levels of symbolic links" });
    expect(fs.lstatSync(loop).isSymbolicLink()).toBe(true);
  });

  it("a regular file reached through /proc/self/cwd is the file itself, replaced as any other", () => {
    const { dir } = folderWith(null);
    const relative = relativePath(process.cwd(), join(dir, "x.csv"));
    expect(resolveTarget(`/proc/self/cwd/${relative}`)).toEqual({ path: `${fs.realpathSync(dir)}/x.csv`, special: false, folder: false });
  });

  it("a name of 240 characters is written (its temporary file's name is shortened to fit)", async () => {
    const { dir } = folderWith(null);
    const long = join(dir, `${"b".repeat(240)}.txt`);
    expect((await writeAll(long, ["new\n"])).ok).toBe(true);
    expect(fs.readdirSync(dir)).toEqual([`${"b".repeat(240)}.txt`]);
  });

  it("settled and then dropped: the previous file is kept and the temporary file removed", async () => {
    const { dir, path } = folderWith("previous\n");
    const opened = openOutput(path, noStdout);
    if (!opened.ok) throw new Error("open failed");
    await opened.value.write("new\n");
    expect((await opened.value.settle()).ok).toBe(true);
    expect(fs.readFileSync(path, "utf8")).toBe("previous\n");
    opened.value.abort();
    expect(fs.readdirSync(dir)).toEqual(["out.csv"]);
  });
});

describe("standard output redirected to a regular file", () => {
  it("is written through its descriptor, a full disk reported (not dropped)", async () => {
    const { dir } = folderWith(null);
    const fd = fs.openSync(join(dir, "redirected.json"), "w");
    try {
      const stream: OutputStream = { write: () => true, once: () => undefined, fd };
      const full = openOutput(undefined, stream, failingDisk(10, "ENOSPC"));
      if (!full.ok) throw new Error("open failed");
      await full.value.write("0123456789abcdef");
      const committed = await full.value.commit();
      expect(committed.ok).toBe(false);
      if (!committed.ok) expect(committed.issues).toMatchObject({ code: "stdout-failed", reason: "no space left on the device" });
      const fine = openOutput(undefined, stream);
      if (!fine.ok) throw new Error("open failed");
      await fine.value.write("ghij\n");
      expect((await fine.value.commit()).ok).toBe(true);
      expect(fs.readFileSync(join(dir, "redirected.json"), "utf8")).toBe("0123456789ghij\n");
    } finally {
      fs.closeSync(fd);
    }
  });

  it("completes short writes on the descriptor (a write that takes fewer bytes than given)", async () => {
    const { dir } = folderWith(null);
    const fd = fs.openSync(join(dir, "short.json"), "w");
    const threeAtATime: FileOps = {
      ...fs,
      writeSync: ((f: number, bytes: Uint8Array, offset: number, length: number) =>
        fs.writeSync(f, bytes, offset, Math.min(3, length))) as FileOps["writeSync"],
    };
    try {
      const opened = openOutput(undefined, { write: () => true, once: () => undefined, fd }, threeAtATime);
      if (!opened.ok) throw new Error("open failed");
      await opened.value.write("a text longer than three bytes\n");
      expect((await opened.value.commit()).ok).toBe(true);
    } finally {
      fs.closeSync(fd);
    }
    expect(fs.readFileSync(join(dir, "short.json"), "utf8")).toBe("a text longer than three bytes\n");
  });

  it("a folder there is refused", () => {
    const { dir } = folderWith(null);
    const fd = fs.openSync(dir, "r");
    try {
      const opened = openOutput(undefined, { write: () => true, once: () => undefined, fd });
      expect(opened.ok).toBe(false);
    } finally {
      fs.closeSync(fd);
    }
  });
});

describe("special files", () => {
  it("are written in place: devices, /dev and /proc paths, FIFOs", () => {
    expect(resolveTarget("/dev/null").special).toBe(true);
    expect(resolveTarget("/dev/stdout").special).toBe(true);
    expect(resolveTarget("/proc/self/fd/1").special).toBe(true);
    const { dir } = folderWith(null);
    const fifo = join(dir, "pipe");
    execFileSync("mkfifo", [fifo]);
    expect(resolveTarget(fifo).special).toBe(true);
    expect(resolveTarget(join(dir, "plain.csv")).special).toBe(false);
  });

  it("/dev/null takes the output and stays a device (no file replaces it)", async () => {
    expect((await writeAll("/dev/null", ["anything\n"])).ok).toBe(true);
    expect(fs.statSync("/dev/null").isCharacterDevice()).toBe(true);
  });

  it("/dev/full is a full disk: the write fails with its reason", async () => {
    const committed = await writeAll("/dev/full", ["anything\n"]);
    expect(committed.ok).toBe(false);
    if (!committed.ok) expect(committed.issues).toMatchObject({ code: "write-failed", reason: "no space left on the device" });
    expect(fs.statSync("/dev/full").isCharacterDevice()).toBe(true);
  });
});

describe("standard output", () => {
  it("waits for the reader when the stream asks (back-pressure), then goes on", async () => {
    const drains: (() => void)[] = [];
    const written: string[] = [];
    const stream: OutputStream = {
      write: (chunk) => {
        written.push(typeof chunk === "string" ? chunk : Buffer.from(chunk).toString());
        return written.length <= 1;
      },
      once: (_event, listener) => drains.push(listener),
    };
    const opened = openOutput(undefined, stream);
    if (!opened.ok) throw new Error("open failed");
    await opened.value.write("first");
    let second = false;
    const pending = opened.value.write("second").then(() => {
      second = true;
    });
    await new Promise((done) => setImmediate(done));
    expect(second).toBe(false);
    expect(drains).toHaveLength(1);
    drains[0]!();
    await pending;
    expect(second).toBe(true);
    expect(written).toEqual(["first", "second"]);
  });

  it("takes text in pieces as their concatenation", async () => {
    const written: string[] = [];
    const stream: OutputStream = { write: (chunk) => written.push(String(chunk)) > 0, once: () => undefined };
    const opened = openOutput(undefined, stream);
    if (!opened.ok) throw new Error("open failed");
    await opened.value.write(['{"a":1}', "\n", '{"b":\u00e9}', "\n"]);
    expect(written.join("")).toBe('{"a":1}\n{"b":\u00e9}\n');
  });

  it("copies bytes handed to it, so the caller may reuse its buffer once a write resolves", async () => {
    const kept: (string | Uint8Array)[] = [];
    const stream: OutputStream = { write: (chunk) => kept.push(chunk) > 0, once: () => undefined };
    const opened = openOutput(undefined, stream);
    if (!opened.ok) throw new Error("open failed");
    const buffer = new TextEncoder().encode("abc");
    await opened.value.write(buffer);
    buffer.fill(120);
    await opened.value.write(buffer);
    expect(kept.map((chunk) => Buffer.from(chunk).toString())).toEqual(["abc", "xxx"]);
  });
});
