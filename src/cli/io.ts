/** The CLI's only contact with the outside: streams and files, injected so tests never touch the real ones. */
import { renameSync, writeFileSync, unlinkSync, existsSync } from 'node:fs';
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

export function writeFileAtomic(path: string, content: string): void {
  const temp = join(dirname(path), `.${basename(path)}.${process.pid}.${Date.now()}.tmp`);
  try {
    writeFileSync(temp, content);
    renameSync(temp, path);
  } catch (error) {
    try { unlinkSync(temp); } catch { /* the temp file may not exist */ }
    throw error;
  }
}

export const processIo: Io = {
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
  writeFile: writeFileAtomic,
  exists: existsSync,
  stderrIsTTY: Boolean(process.stderr.isTTY) && !process.env.CI,
};
