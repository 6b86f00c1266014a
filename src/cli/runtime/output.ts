/**
 * The one way every command writes its outputs (reports, records, windows, samples, charts, the HTML
 * report), to a file or to standard output. What it promises (README, "Outputs"):
 * - a regular file (or a name not yet taken) is written to a temporary file in the target's folder,
 *   every write checked (short writes, ENOSPC, EIO), then flushed to the disk (fsync) and renamed over
 *   the target only when the whole output is written; on any failure, a signal or `abort`, the
 *   temporary file is removed and the previous file is left as it was. A replaced file keeps its mode
 *   (and, where the process may set it, its owner). A symbolic link is followed: its target is
 *   replaced and the link kept.
 * - a special file (character device, FIFO, socket, a process's descriptor by name such as
 *   /dev/stdout or /proc/self/fd/1) cannot be replaced: it is opened and written directly, every
 *   write checked. A folder, or a path naming one (`out.csv/`), is refused before anything is
 *   written; links and ".." resolve as the system resolves them.
 * - standard output is written with back-pressure (a slow reader never makes memory grow); its
 *   errors are handled once, in main.ts (a closed pipe ends the run quietly, a full disk is exit 4).
 *   Redirected to a regular file, it is written through its descriptor with every write checked.
 * - several outputs of one run settle (written, flushed, closed) before any is renamed (io.ts).
 * File operations come through `FileOps` so tests can inject a failing disk.
 */
import * as fs from "node:fs";
import { basename, dirname, join, resolve } from "node:path";
import { failure, type Result, success } from "../../core/result.js";
import { type CliIssue, fileErrorReason } from "../messages.js";

/**
 * Text handed over whole, or as pieces written in order (each piece's UTF-8 bytes, as Buffer.from
 * gives them: a surrogate pair split across two pieces is two replacement characters), so that a
 * batch's records are never joined into one string of megabytes (fresh memory, a fault every 4 KiB).
 */
export type OutputText = string | readonly string[];

/** Where a command's output goes, piece by piece. */
export interface OutputTarget {
  /**
   * Appends `text` (or bytes, which the caller may reuse once this resolves: they are written or
   * copied by then). Resolves when the target can take more; a failure is kept for `commit`.
   */
  write(text: OutputText | Uint8Array): Promise<void>;
  /**
   * Finishes the writing (flush, fsync, close) without making it final: ok, or why not (the target is
   * then as it was). Several outputs settle before any commits, so that one failing replaces none.
   */
  settle(): Promise<Result<void, CliIssue>>;
  /** Makes the output final (settling it first if need be, then the rename): ok, or why not (the previous file is then intact). */
  commit(): Promise<Result<void, CliIssue>>;
  /** Drops what was written: the temporary file is removed, the target left as it was. */
  abort(): void;
}

/** The file system calls the output path makes (node:fs by default; tests inject failures). */
export type FileOps = Pick<
  typeof fs,
  | "openSync"
  | "writeSync"
  | "fsyncSync"
  | "fdatasync"
  | "closeSync"
  | "renameSync"
  | "unlinkSync"
  | "statSync"
  | "lstatSync"
  | "readlinkSync"
  | "realpathSync"
  | "fchmodSync"
  | "fchownSync"
  | "fstatSync"
>;

/** The stream standard output is written to (process.stdout in the CLI). */
export interface OutputStream {
  write(chunk: string | Uint8Array): boolean;
  once(event: "drain", listener: () => void): unknown;
  /** Its descriptor, when it has one (process.stdout's is 1): a regular file there is written through it. */
  readonly fd?: number;
}

/** Temporary files in the making: removed on a signal (main.ts) whatever the run was doing. */
const temporaries = new Set<string>();
let created = 0;

/** Removes every temporary file still in the making (for signal handlers: synchronous, never throws). */
export function removeTemporaries(ops: FileOps = fs): void {
  for (const path of temporaries) {
    try {
      ops.unlinkSync(path);
    } catch {
      // already gone
    }
  }
  temporaries.clear();
}

/** Written to a file this many bytes at a time between yields, so a signal is handled promptly. */
const yieldEvery = 8 << 20;
/**
 * A large temporary file is flushed to the disk in the background (fdatasync on libuv's thread pool)
 * every this many bytes, while the command goes on producing: the fsync before the rename then has
 * little left to wait for (roll's every window of 1M rows, 685 MB: the fsync took 0.44 s before, in a
 * CPU profile, and 0.008 s after, under strace). A failure of it fails the commit.
 */
const flushEvery = 64 << 20;

/** Standard output (path undefined) or the file at `path`. Nothing is created until this is called. */
export function openOutput(path: string | undefined, stdout: OutputStream, ops: FileOps = fs): Result<OutputTarget, CliIssue> {
  if (path === undefined) return standardOutput(stdout, ops);
  if (namesFolder(path)) return failure({ code: "write-failed", path, reason: "the path names a folder, not a file" });
  const target = resolveTarget(path, ops);
  if (target.special) return directTarget(path, ops);
  if (target.folder) return failure({ code: "write-failed", path, reason: "it is a folder, not a file" });
  if (isLink(target.path, ops)) return failure({ code: "write-failed", path, reason: "too many levels of symbolic links" });
  return replacingTarget(path, target.path, ops);
}

/**
 * Standard output: a stream with back-pressure, or, when it is a regular file (`> out.json`), its
 * descriptor written with every write checked as a file's are (Node's stream for a file drops the
 * rest of a short write: a full disk would give a truncated file and no error). A folder there is
 * refused.
 */
function standardOutput(stdout: OutputStream, ops: FileOps): Result<OutputTarget, CliIssue> {
  const { fd } = stdout;
  if (fd === undefined) return success(streamTarget(stdout));
  let stats: fs.Stats;
  try {
    stats = ops.fstatSync(fd);
  } catch {
    return success(streamTarget(stdout));
  }
  if (stats.isDirectory()) return failure({ code: "stdout-failed", reason: "it is a folder" });
  if (!stats.isFile()) return success(streamTarget(stdout));
  const writer = checkedWriter(ops, fd);
  const settle = async (): Promise<Result<void, CliIssue>> =>
    writer.failed === null ? success(undefined) : failure({ code: "stdout-failed", reason: fileErrorReason(writer.failed) });
  return success({ write: async (text) => void (await writer.write(text)), settle, commit: settle, abort: () => undefined });
}

function streamTarget(stdout: OutputStream): OutputTarget {
  return {
    // A stream may keep a chunk until it is flushed: bytes are copied, as their caller reuses them.
    write: (text) =>
      stdout.write(typeof text === "string" ? text : text instanceof Uint8Array ? Buffer.from(text) : text.join(""))
        ? Promise.resolve()
        : new Promise<void>((done) => void stdout.once("drain", () => done())),
    settle: async () => success(undefined),
    commit: async () => success(undefined),
    abort: () => undefined,
  };
}

/**
 * A path that names a folder whatever is there (empty, ending in "/", or its last part "." or ".."):
 * never an output file. (Normalised lexically, `report.csv/` would become `report.csv`.)
 */
export function namesFolder(path: string): boolean {
  return path === "" || path.endsWith("/") || /(^|\/)\.\.?$/.test(path);
}

/** A process's descriptors by name (/dev/stdout, /dev/fd/1, /proc/self/fd/1): written in place, never replaced. */
const descriptorAlias = /^\/dev\/(?:std(?:in|out|err)|fd\/)|^\/proc\/[^/]+\/fd\//;

/**
 * The file a write to `path` lands in (links followed as the system follows them: a link's ".." is
 * its target's parent, not the link's), whether it must be written in place, and whether it is a folder.
 */
export function resolveTarget(path: string, ops: FileOps = fs): { path: string; special: boolean; folder: boolean } {
  const absolute = resolve(path);
  if (descriptorAlias.test(absolute)) return { path: absolute, special: true, folder: false };
  // Anything else by what it is: a device, FIFO or socket is special, a regular file (even under
  // /dev/shm or reached through /proc/self/cwd) is replaced.
  const real = physicalPath(path, ops);
  try {
    const stats = ops.statSync(real);
    return { path: real, special: !stats.isFile() && !stats.isDirectory(), folder: stats.isDirectory() };
  } catch {
    return { path: real, special: false, folder: false };
  }
}

/** The system's own resolution of a path (realpath(3)): Node's realpathSync folds ".." before it follows links. */
function systemRealpath(ops: FileOps): (path: string) => string {
  const native = (ops.realpathSync as { native?: (path: string) => string }).native;
  return (path) => String(native === undefined ? ops.realpathSync(path) : native(path));
}

/** `path` resolved: itself when it exists, else its folder resolved and its name (or where a dangling link points). */
function physicalPath(path: string, ops: FileOps): string {
  const realpath = systemRealpath(ops);
  try {
    return realpath(path);
  } catch {
    return danglingLinkTarget(inRealFolder(path, realpath), ops, realpath);
  }
}

/** `path`'s folder as the system resolves it, joined with its name (the folder as written when it does not exist). */
function inRealFolder(path: string, realpath: (path: string) => string): string {
  let folder: string;
  try {
    folder = realpath(dirname(path));
  } catch {
    folder = resolve(dirname(path));
  }
  return join(folder, basename(path));
}

/** A path that does not exist yet: itself, or where its (chain of) dangling symbolic links point (a loop: the last link). */
function danglingLinkTarget(path: string, ops: FileOps, realpath: (path: string) => string): string {
  let current = path;
  for (let hops = 0; hops < 40; hops++) {
    let link: string;
    try {
      if (!ops.lstatSync(current).isSymbolicLink()) return current;
      link = String(ops.readlinkSync(current));
    } catch {
      return current;
    }
    current = inRealFolder(link.startsWith("/") ? link : `${dirname(current)}/${link}`, realpath);
  }
  return current;
}

/** True when `path` is a symbolic link (one left unresolved: a loop). */
function isLink(path: string, ops: FileOps): boolean {
  try {
    return ops.lstatSync(path).isSymbolicLink();
  } catch {
    return false;
  }
}

/** Writes all of `bytes` at the descriptor, however many calls it takes (a short write is not an error). */
function writeAll(ops: FileOps, fd: number, bytes: Uint8Array): void {
  let offset = 0;
  while (offset < bytes.length) offset += ops.writeSync(fd, bytes, offset, bytes.length - offset);
}

/** A single text shorter than this is encoded on its own; longer texts and pieces go through one reused buffer. */
const longText = 1 << 16;
/** The reused buffer: 256 KiB, so its pages (a fault each on first use) are few and stay in the cache. */
const textBufferBytes = 1 << 18;
let textBuffer: Uint8Array | null = null;
const encoder = new TextEncoder();

/**
 * Writes the UTF-8 bytes of `text`: a long text, or pieces, through one reused buffer (filled piece
 * after piece and written when full), so that an output of megabytes is never encoded whole into fresh
 * memory. Nothing is kept between calls. Returns the bytes written.
 */
function writeText(ops: FileOps, fd: number, text: OutputText): number {
  if (typeof text === "string" && text.length < longText) {
    const bytes = Buffer.from(text);
    writeAll(ops, fd, bytes);
    return bytes.length;
  }
  textBuffer ??= new Uint8Array(textBufferBytes);
  let filled = 0;
  let total = 0;
  for (const piece of typeof text === "string" ? [text] : text) {
    let rest = piece;
    while (rest.length > 0) {
      // encodeInto stops before a character that does not fit whole, so pieces never split one.
      const { read, written } = encoder.encodeInto(rest, textBuffer.subarray(filled));
      filled += written;
      if (read === rest.length) break;
      writeAll(ops, fd, textBuffer.subarray(0, filled));
      total += filled;
      filled = 0;
      rest = rest.slice(read);
    }
  }
  if (filled > 0) writeAll(ops, fd, textBuffer.subarray(0, filled));
  return total + filled;
}

/** Writes that yield to the event loop now and then (signals), and remember the first failure. */
function checkedWriter(ops: FileOps, fd: number) {
  let failed: unknown = null;
  let sinceYield = 0;
  return {
    get failed() {
      return failed;
    },
    /** Writes `text` (bytes at once); resolves to the bytes written, 0 after a failure. */
    async write(text: OutputText | Uint8Array): Promise<number> {
      if (failed !== null) return 0;
      let length: number;
      try {
        if (!(text instanceof Uint8Array)) length = writeText(ops, fd, text);
        else {
          writeAll(ops, fd, text);
          length = text.length;
        }
      } catch (error) {
        failed = error;
        return 0;
      }
      sinceYield += length;
      if (sinceYield >= yieldEvery) {
        sinceYield = 0;
        await new Promise<void>((done) => setImmediate(done));
      }
      return length;
    },
  };
}

function closeQuietly(ops: FileOps, fd: number): void {
  try {
    ops.closeSync(fd);
  } catch {
    // already closed
  }
}

/** A device, FIFO or /proc link: opened for appending and written in place. */
function directTarget(path: string, ops: FileOps): Result<OutputTarget, CliIssue> {
  let fd: number;
  try {
    fd = ops.openSync(path, "a");
  } catch (error) {
    return failure({ code: "write-failed", path, reason: fileErrorReason(error) });
  }
  const writer = checkedWriter(ops, fd);
  let open = true;
  let settled: Result<void, CliIssue> | null = null;
  const settle = async (): Promise<Result<void, CliIssue>> => {
    if (settled !== null) return settled;
    open = false;
    if (writer.failed !== null) {
      closeQuietly(ops, fd);
      settled = failure({ code: "write-failed", path, reason: fileErrorReason(writer.failed) });
      return settled;
    }
    try {
      // Closed once: a close that fails has released the descriptor all the same (its number may be reused).
      ops.closeSync(fd);
      settled = success(undefined);
    } catch (error) {
      settled = failure({ code: "write-failed", path, reason: fileErrorReason(error) });
    }
    return settled;
  };
  return success({
    write: async (text) => void (await writer.write(text)),
    settle,
    commit: settle,
    abort() {
      if (open) closeQuietly(ops, fd);
      open = false;
    },
  });
}

/** A regular file (or a new one): a temporary file beside it, renamed over it on commit. */
function replacingTarget(path: string, target: string, ops: FileOps): Result<OutputTarget, CliIssue> {
  created += 1;
  const random = Math.floor(Math.random() * 0x1_0000_0000)
    .toString(16)
    .padStart(8, "0");
  // The process id and a counter make the name unique on this host, the random part across hosts
  // sharing a folder; "wx" creates it exclusively, so a clash fails rather than overwrites.
  // A long name is shortened in the temporary's, which must fit the folder's limit (255 bytes) too.
  const name = basename(target);
  const stem = Buffer.byteLength(name) > 180 ? `${name.slice(0, 48)}~` : name;
  const temporary = join(dirname(target), `.${stem}.betabound-${process.pid}-${created}-${random}.tmp`);
  let fd: number;
  try {
    fd = ops.openSync(temporary, "wx", 0o666);
    temporaries.add(temporary);
  } catch (error) {
    return failure({ code: "write-failed", path, reason: fileErrorReason(error) });
  }
  let sinceFlush = 0;
  let flushing: Promise<unknown> | null = null;
  let flushFailed: unknown = null;
  let closed = false;
  const close = (): void => {
    if (!closed) closeQuietly(ops, fd);
    closed = true;
  };
  const remove = (): void => {
    // A background flush still running keeps the descriptor until it is over.
    if (flushing === null) close();
    else void flushing.then(close);
    try {
      ops.unlinkSync(temporary);
    } catch {
      // already gone
    }
    temporaries.delete(temporary);
  };
  const writer = checkedWriter(ops, fd);
  let done = false;
  const write = async (text: OutputText | Uint8Array): Promise<void> => {
    sinceFlush += await writer.write(text);
    if (sinceFlush < flushEvery || flushing !== null || writer.failed !== null || done) return;
    sinceFlush = 0;
    flushing = new Promise((settled) =>
      ops.fdatasync(fd, (error) => {
        if (error !== null && flushFailed === null) flushFailed = error;
        flushing = null;
        settled(undefined);
      }),
    );
  };
  let settled: Result<void, CliIssue> | null = null;
  const settle = async (): Promise<Result<void, CliIssue>> => {
    if (settled !== null) return settled;
    done = true;
    try {
      // The descriptor stays open until a background flush is over (it runs on another thread).
      if (flushing !== null) await flushing;
      if (writer.failed !== null) throw writer.failed;
      if (flushFailed !== null) throw flushFailed;
      keepModeAndOwner(ops, fd, target);
      ops.fsyncSync(fd);
      closed = true;
      ops.closeSync(fd);
      settled = success(undefined);
    } catch (error) {
      remove();
      settled = failure({ code: "write-failed", path, reason: fileErrorReason(error) });
    }
    return settled;
  };
  let renamed = false;
  return success({
    write,
    settle,
    async commit() {
      const ready = await settle();
      if (!ready.ok || renamed) return ready;
      try {
        ops.renameSync(temporary, target);
        renamed = true;
        temporaries.delete(temporary);
        return success(undefined);
      } catch (error) {
        remove();
        settled = failure({ code: "write-failed", path, reason: fileErrorReason(error) });
        return settled;
      }
    },
    abort() {
      // Before the rename (settled or not), the temporary file goes; a failed settle removed it already.
      if (!renamed && temporaries.has(temporary)) remove();
      done = true;
    },
  });
}

/** Gives the new file the mode (and owner, where allowed) of the file it replaces, if any. */
function keepModeAndOwner(ops: FileOps, fd: number, target: string): void {
  let stats: fs.Stats;
  try {
    stats = ops.statSync(target);
  } catch {
    return; // nothing replaced: the new file has the default mode (umask applied)
  }
  ops.fchmodSync(fd, stats.mode & 0o7777);
  try {
    ops.fchownSync(fd, stats.uid, stats.gid);
  } catch {
    // only the owner's own files, unless privileged: the owner becomes this user's
  }
}
