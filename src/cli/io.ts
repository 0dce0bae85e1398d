/** The CLI's only contact with the outside: streams and files, injected so tests never touch the real ones. */
import { closeSync, existsSync, fchmodSync, lstatSync, openSync, renameSync, statSync, unlinkSync, writeSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { basename, dirname, join } from 'node:path';

export interface Io {
  stdout(text: string): void;
  stderr(text: string): void;
  /** Writes a whole file atomically (temp file in the same folder, then rename). */
  writeFile(path: string, content: string): void;
  exists(path: string): boolean;
  /** Whether stderr is an interactive terminal (progress bars only then). */
  readonly stderrIsTTY: boolean;
}

/** What a path names, without following a final symbolic link. */
export type PathKind = 'absent' | 'regular file' | 'directory' | 'symbolic link' | 'character device' | 'block device' | 'FIFO (named pipe)' | 'socket';

export function pathKind(path: string): PathKind {
  let s;
  try {
    s = lstatSync(path);
  } catch {
    return 'absent';
  }
  if (s.isSymbolicLink()) return 'symbolic link';
  if (s.isFile()) return 'regular file';
  if (s.isDirectory()) return 'directory';
  if (s.isCharacterDevice()) return 'character device';
  if (s.isBlockDevice()) return 'block device';
  if (s.isFIFO()) return 'FIFO (named pipe)';
  return 'socket';
}

/** Whether two paths name the same file (same device and inode, through symbolic and hard links); false when either is absent. */
export function sameFile(a: string, b: string): boolean {
  try {
    const x = statSync(a);
    const y = statSync(b);
    return x.dev === y.dev && x.ino === y.ino;
  } catch {
    return false;
  }
}

/**
 * A new temp file beside `path`, created exclusively (O_EXCL: never through a link planted at its
 * name) under an unguessable name, with the mode of the file it will replace.
 */
export function openTemp(path: string): { fd: number; temp: string } {
  const temp = join(dirname(path), `.${basename(path)}.${randomBytes(8).toString('hex')}.tmp`);
  const fd = openSync(temp, 'wx', 0o666);
  try {
    const existing = lstatSync(path, { throwIfNoEntry: false });
    if (existing?.isFile()) fchmodSync(fd, existing.mode & 0o7777);
  } catch (error) {
    closeSync(fd);
    unlinkSync(temp);
    throw error;
  }
  return { fd, temp };
}

/** Writes all of `text` to `fd` (a single write may be short). */
export function writeAll(fd: number, text: string): void {
  const bytes = Buffer.from(text, 'utf8');
  for (let at = 0; at < bytes.length;) at += writeSync(fd, bytes, at, bytes.length - at);
}

export function writeFileAtomic(path: string, content: string): void {
  const { fd, temp } = openTemp(path);
  try {
    writeAll(fd, content);
    closeSync(fd);
    renameSync(temp, path);
  } catch (error) {
    try { closeSync(fd); } catch { /* already closed */ }
    try { unlinkSync(temp); } catch { /* already renamed or removed */ }
    throw error;
  }
}

/** A failed write to stdout or stderr (a full disk, a closed pipe), kept apart from the command's own errors. */
export class StreamWriteError extends Error {
  constructor(readonly stream: 'standard output' | 'standard error', readonly code: string) {
    super(`cannot write to ${stream} (${code})`);
    this.name = 'StreamWriteError';
  }
}

function streamWriter(stream: NodeJS.WriteStream, name: StreamWriteError['stream']): (text: string) => void {
  return (text) => {
    try {
      stream.write(text);
    } catch (error) {
      throw new StreamWriteError(name, (error as NodeJS.ErrnoException).code ?? 'error');
    }
  };
}

export const processIo: Io = {
  stdout: streamWriter(process.stdout, 'standard output'),
  stderr: streamWriter(process.stderr, 'standard error'),
  writeFile: writeFileAtomic,
  exists: existsSync,
  stderrIsTTY: Boolean(process.stderr.isTTY) && !process.env.CI,
};
