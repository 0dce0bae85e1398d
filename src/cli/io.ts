/** The CLI's only contact with the outside: streams and files, injected so tests never touch the real ones. */
import {
  type Stats,
  closeSync,
  existsSync,
  fchmodSync,
  fstatSync,
  lstatSync,
  openSync,
  readSync,
  renameSync,
  statSync,
  unlinkSync,
  writeSync,
} from 'node:fs';
import { randomBytes } from 'node:crypto';
import { basename, dirname, join } from 'node:path';

export interface Io {
  stdout(text: string): void;
  stderr(text: string): void;
  /** Writes a whole file atomically (temp file in the same folder, then rename). */
  writeFile(path: string, content: string): void;
  /** Opens a file written piece by piece (a large output, streamed), which takes its name only when committed. */
  openFileStream(path: string): FileStream;
  exists(path: string): boolean;
  /** Whether stderr is an interactive terminal (progress bars only then). */
  readonly stderrIsTTY: boolean;
  /**
   * Standard input as text, read to its end but never more than `limit` + 1 bytes (so the caller
   * can tell it is over the limit); throws a `StdinError` when it cannot be read. Absent: no stdin.
   */
  readonly readStdin?: (limit: number) => string;
  /** The clock for dates written into outputs (a fixed one in tests). */
  readonly now?: () => Date;
  /** The command's words after the program name, as given (set by `run`). */
  readonly argv?: readonly string[];
}

/** A file being written: a temp file in the target's folder until `commit` renames it into place. */
export interface FileStream {
  write(text: string): void;
  /** Closes the temp file and renames it to the target; `beforeRename` may refuse by throwing. */
  commit(beforeRename?: () => void): void;
  /** Closes and removes the temp file; calling it again does nothing. */
  abandon(): void;
}

/** Why standard input could not be read (a terminal, a closed descriptor). */
export class StdinError extends Error {
  constructor(readonly reason: string) {
    super(reason);
    this.name = 'StdinError';
  }
}

/** Reads fd 0 to its end, at most `limit` + 1 bytes; refuses a terminal, which would wait for typing. */
export function readProcessStdin(limit: number): string {
  let stat: Stats;
  try {
    stat = fstatSync(0);
  } catch (error) {
    throw new StdinError(`standard input cannot be read (${(error as NodeJS.ErrnoException).code ?? 'error'})`);
  }
  if (stat.isCharacterDevice() && process.stdin.isTTY)
    throw new StdinError('standard input is a terminal; pipe or redirect a design into it');
  const chunks: Buffer[] = [];
  let total = 0;
  for (;;) {
    const chunk = Buffer.allocUnsafe(Math.min(1 << 16, limit + 1 - total));
    let n: number;
    try {
      n = readSync(0, chunk, 0, chunk.length, null);
    } catch (error) {
      const code = (error as NodeJS.ErrnoException).code;
      if (code === 'EAGAIN') continue;
      if (code === 'EOF') break;
      throw new StdinError(`standard input cannot be read (${code ?? 'error'})`);
    }
    if (n === 0) break;
    chunks.push(chunk.subarray(0, n));
    total += n;
    if (total > limit) break;
  }
  return Buffer.concat(chunks, total).toString('utf8');
}

/** What a path names, without following a final symbolic link. */
export type PathKind =
  | 'absent'
  | 'regular file'
  | 'directory'
  | 'symbolic link'
  | 'character device'
  | 'block device'
  | 'FIFO (named pipe)'
  | 'socket';

export function pathKind(path: string): PathKind {
  let s: Stats;
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
  for (let at = 0; at < bytes.length; ) at += writeSync(fd, bytes, at, bytes.length - at);
}

export function writeFileAtomic(path: string, content: string): void {
  const { fd, temp } = openTemp(path);
  try {
    writeAll(fd, content);
    closeSync(fd);
    renameSync(temp, path);
  } catch (error) {
    discardTemp(fd, temp);
    throw error;
  }
}

/** Closes and removes a temp file, whatever state it was left in (already closed, renamed or removed). */
function discardTemp(fd: number, temp: string): void {
  try {
    closeSync(fd);
  } catch {
    /* already closed */
  }
  try {
    unlinkSync(temp);
  } catch {
    /* already renamed or removed */
  }
}

export function openFileStream(path: string): FileStream {
  const { fd, temp } = openTemp(path);
  return {
    write: (text) => writeAll(fd, text),
    commit: (beforeRename) => {
      closeSync(fd);
      beforeRename?.();
      renameSync(temp, path);
    },
    abandon: () => discardTemp(fd, temp),
  };
}

/** A failed write to stdout or stderr (a full disk, a closed pipe), kept apart from the command's own errors. */
export class StreamWriteError extends Error {
  constructor(
    readonly stream: 'standard output' | 'standard error',
    readonly code: string,
  ) {
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

/**
 * The date outputs record: SOURCE_DATE_EPOCH (seconds since 1970, the reproducible-builds.org
 * convention) when set, so two runs can give the same bytes; else now.
 */
export function sourceDate(env: NodeJS.ProcessEnv = process.env): Date {
  const epoch = env.SOURCE_DATE_EPOCH;
  if (epoch !== undefined && /^\d{1,12}$/.test(epoch)) return new Date(Number(epoch) * 1000);
  return new Date();
}

export const processIo: Io = {
  stdout: streamWriter(process.stdout, 'standard output'),
  stderr: streamWriter(process.stderr, 'standard error'),
  writeFile: writeFileAtomic,
  openFileStream,
  exists: existsSync,
  stderrIsTTY: Boolean(process.stderr.isTTY) && !process.env.CI,
  readStdin: readProcessStdin,
  now: sourceDate,
};
