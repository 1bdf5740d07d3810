/**
 * Every file the command line writes goes through {@link safeWriteFile}; what it promises
 * (docs/data-safety.md):
 *   - an existing file is never replaced unless the user said `--force`;
 *   - never written through a symbolic link, never onto a file the command reads (same path,
 *     another path to the same file, or a hard link to it), even with `--force`;
 *   - the bytes go to a temporary file in the same folder, are flushed to disk, and only then take
 *     the file's name (rename, or a hard link that cannot overwrite when there is nothing to
 *     replace): a failure midway (disk full, permission, interruption) leaves the old file as it
 *     was and removes the temporary file;
 *   - a missing folder is an error that names it; no folder is created.
 *
 * The file-system calls come through {@link OutputFs} (node:fs by default) so tests can make a
 * write fail midway.
 */
import * as nodeFs from "node:fs";
import path from "node:path";
import { RheoError } from "../core/errors";

/** The node:fs calls the writer uses. */
export interface OutputFs {
  lstatSync(p: string): nodeFs.Stats;
  statSync(p: string): nodeFs.Stats;
  realpathSync(p: string): string;
  openSync(p: string, flags: string, mode?: number): number;
  writeSync(fd: number, data: Uint8Array, offset: number, length: number): number;
  fsyncSync(fd: number): void;
  closeSync(fd: number): void;
  renameSync(from: string, to: string): void;
  linkSync(existing: string, link: string): void;
  unlinkSync(p: string): void;
  chmodSync(p: string, mode: number): void;
}

/** How one output may be written. */
export interface OutputOptions {
  /** the option that named the file, e.g. "--out"; errors name it */
  flag: string;
  /** replace an existing regular file (`--force`) */
  force: boolean;
  /** files the command reads: never written to, whatever `force` says */
  inputs: readonly string[];
}

/** Stable codes of the refusals (RheoError.code). */
export const OUTPUT_ERROR_CODES = Object.freeze({
  exists: "OUTPUT_EXISTS",
  symlink: "OUTPUT_IS_SYMLINK",
  notFile: "OUTPUT_NOT_A_FILE",
  input: "OUTPUT_IS_INPUT",
  folder: "OUTPUT_FOLDER_MISSING",
  failed: "OUTPUT_WRITE_FAILED",
});

const errno = (e: unknown): string | undefined => (e as NodeJS.ErrnoException | undefined)?.code;

/** The stat of `p` without following a final symlink, or null when nothing is there. */
function lstatOrNull(fs: OutputFs, p: string): nodeFs.Stats | null {
  try {
    return fs.lstatSync(p);
  } catch (e) {
    if (errno(e) === "ENOENT" || errno(e) === "ENOTDIR") return null;
    throw e;
  }
}

/** The canonical path of a file that may not exist yet: its folder resolved, its name kept. */
function canonical(fs: OutputFs, p: string): string {
  const abs = path.resolve(p);
  try {
    return fs.realpathSync(abs);
  } catch {
    try {
      return path.join(fs.realpathSync(path.dirname(abs)), path.basename(abs));
    } catch {
      return abs;
    }
  }
}

function refuse(options: OutputOptions, detail: string, code: string): never {
  throw new RheoError("value", options.flag, detail, undefined, code);
}

/** Plain words for an operating-system error. */
function cause(e: unknown): string {
  const code = errno(e);
  const words: Record<string, string> = {
    ENOSPC: "the disk is full",
    EDQUOT: "the disk quota is used up",
    EACCES: "permission denied",
    EPERM: "operation not permitted",
    EROFS: "the file system is read-only",
    EIO: "input/output error",
    EISDIR: "it is a folder",
  };
  return (code && words[code]) ?? (e as Error).message ?? String(e);
}

/**
 * Checks that `file` may be written under `options` (before any work is done, and again by
 * {@link safeWriteFile}).
 * @throws RheoError("value", options.flag) with a code of {@link OUTPUT_ERROR_CODES}: the folder
 *   is missing (named), the path is a symlink or a folder, it is one of the inputs, or it exists
 *   and `force` is false.
 */
export function checkOutput(file: string, options: OutputOptions, fs: OutputFs = nodeFs): void {
  const folder = path.dirname(path.resolve(file));
  let folderStat: nodeFs.Stats | null;
  try {
    folderStat = fs.statSync(folder);
  } catch {
    folderStat = null;
  }
  if (!folderStat) refuse(options, `the folder "${path.dirname(file)}" does not exist; create it first (nothing was written)`, OUTPUT_ERROR_CODES.folder);
  if (!folderStat.isDirectory()) refuse(options, `"${path.dirname(file)}" is not a folder (nothing was written)`, OUTPUT_ERROR_CODES.folder);
  const target = lstatOrNull(fs, file);
  if (target?.isSymbolicLink()) refuse(options, `"${file}" is a symbolic link; give the path of a real file (links are never written through, even with --force)`, OUTPUT_ERROR_CODES.symlink);
  if (target && !target.isFile()) refuse(options, `"${file}" exists and is not a regular file (a folder or device); choose another name`, OUTPUT_ERROR_CODES.notFile);
  const out = canonical(fs, file);
  for (const input of options.inputs) {
    let same = canonical(fs, input) === out;
    if (!same && target) {
      try {
        const s = fs.statSync(input);
        same = s.ino === target.ino && s.dev === target.dev;
      } catch {
        same = false;
      }
    }
    if (same) refuse(options, `"${file}" is the input file "${input}"; write the results to another file (inputs are never overwritten, even with --force)`, OUTPUT_ERROR_CODES.input);
  }
  if (target && !options.force) refuse(options, `"${file}" already exists; add --force to replace it, or choose another name`, OUTPUT_ERROR_CODES.exists);
}

let counter = 0;

/**
 * Writes `data` to `file` safely (see the module comment): checks it ({@link checkOutput}), writes
 * a temporary file beside it, flushes it, then gives it the file's name.
 * @throws RheoError("value", options.flag) when the path is refused, or when the write fails
 *   (code OUTPUT_WRITE_FAILED; the old file, if any, is unchanged and the temporary file removed).
 * @example safeWriteFile("results.xlsx", bytes, { flag: "--out", force: false, inputs: ["data.csv"] })
 */
export function safeWriteFile(file: string, data: Uint8Array | string, options: OutputOptions, fs: OutputFs = nodeFs): void {
  checkOutput(file, options, fs);
  const bytes = typeof data === "string" ? new TextEncoder().encode(data) : data;
  const old = lstatOrNull(fs, file);
  const folder = path.dirname(path.resolve(file));
  const temp = path.join(folder, `.${path.basename(file)}.${process.pid}.${++counter}.tmp`);
  let fd: number | null = null;
  // true once the temporary file itself has become `file` (rename): it must not be removed then
  let placed = false;
  try {
    fd = fs.openSync(temp, "wx", 0o666);
    for (let offset = 0; offset < bytes.length; ) offset += fs.writeSync(fd, bytes, offset, bytes.length - offset);
    fs.fsyncSync(fd);
    fs.closeSync(fd);
    fd = null;
    if (old) {
      fs.chmodSync(temp, old.mode & 0o7777);
      fs.renameSync(temp, file);
      placed = true;
    } else {
      // a hard link never replaces a file that appeared since the check; file systems without
      // hard links get a rename after one more check
      try {
        fs.linkSync(temp, file);
      } catch (e) {
        if (errno(e) === "EEXIST") refuse(options, `"${file}" appeared while the results were written; add --force to replace it, or choose another name`, OUTPUT_ERROR_CODES.exists);
        checkOutput(file, options, fs);
        fs.renameSync(temp, file);
        placed = true;
      }
    }
  } catch (e) {
    if (fd !== null) {
      try {
        fs.closeSync(fd);
      } catch {
        /* already failing: the write error is the one to report */
      }
    }
    if (!placed) removeQuietly(fs, temp);
    if (e instanceof RheoError) throw e;
    throw new RheoError("value", options.flag, `cannot write "${file}": ${cause(e)}; ${old ? "the existing file is unchanged" : "no file was left behind"}`, undefined, OUTPUT_ERROR_CODES.failed);
  }
  // after a hard link the temporary name is a second name of the new file: drop it
  if (!placed) removeQuietly(fs, temp);
}

function removeQuietly(fs: OutputFs, p: string): void {
  try {
    fs.unlinkSync(p);
  } catch {
    /* nothing there, or nothing more to do */
  }
}
