import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { copyFileSync, existsSync, lstatSync, readdirSync, readFileSync, statSync, symlinkSync, writeFileSync, chmodSync } from 'node:fs';
import { join } from 'node:path';
import { cli, cliAsync, design, fixture, processCard, tempDir } from '../helpers.js';
import { checkOutput } from '../../src/cli/output.js';
import { writeFileAtomic } from '../../src/cli/io.js';
import { InputError } from '../../src/errors.js';

/** A copy of the doubler design in a fresh folder, its card named by absolute path. */
function designCopy(): { dir: string; file: string; text: string } {
  const dir = tempDir();
  const file = join(dir, 'd.yaml');
  const text = readFileSync(design('doubler'), 'utf8').replace(
    'process: ../processes/generic180.yaml',
    `process: ${processCard('generic180')}`,
  );
  writeFileSync(file, text);
  return { dir, file, text };
}

describe('-o onto something that is not a plain file', () => {
  it('refuses a symbolic link with exit 2 and leaves the link and its target as they were', async () => {
    const dir = tempDir();
    const target = join(dir, 'precious.txt');
    writeFileSync(target, 'keep me\n');
    const link = join(dir, 'out.svg');
    symlinkSync(target, link);
    for (const args of [
      ['check', design('doubler')],
      ['draw', design('doubler')],
      ['sweep', design('doubler'), '--vary', 'vdd=1.8'],
    ]) {
      const r = await cliAsync(...args, '-o', link);
      expect(r.code).toBe(2);
      expect(r.stderr).toBe(
        `phasegap: error: --out: "${link}" is a symbolic link; phasegap writes only regular files (use -o - and a shell redirection to write elsewhere)\n`,
      );
    }
    expect(lstatSync(link).isSymbolicLink()).toBe(true);
    expect(readFileSync(target, 'utf8')).toBe('keep me\n');
    expect(readdirSync(dir).sort()).toEqual(['out.svg', 'precious.txt']);
  });

  it('refuses a FIFO at once instead of blocking on it (mkfifo, GNU coreutils)', () => {
    const dir = tempDir();
    const fifo = join(dir, 'pipe');
    execFileSync('mkfifo', [fifo]);
    const r = cli('check', design('doubler'), '-o', fifo);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(`--out: "${fifo}" is a FIFO (named pipe)`);
    expect(statSync(fifo).isFIFO()).toBe(true);
  });

  it('refuses a character device (/dev/null) and a folder', () => {
    expect(cli('schema', '-o', '/dev/null').stderr).toContain('--out: "/dev/null" is a character device');
    const dir = tempDir();
    const r = cli('schema', '-o', dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('is a directory');
  });
});

describe('-o onto an input', () => {
  it('refuses the design file under another spelling of its path, and the design stays as it was', async () => {
    const { dir, file, text } = designCopy();
    const other = join(dir, '..', dir.split('/').pop()!, 'd.yaml');
    for (const args of [
      ['check', file],
      ['tune', file],
      ['sweep', file, '--vary', 'vdd=1.8'],
      ['report', file, '--no-fmax', '--no-tune'],
    ]) {
      const r = await cliAsync(...args, '-o', other);
      expect(r.code).toBe(2);
      expect(r.stderr).toContain(`is an input of this command (${file})`);
    }
    expect(readFileSync(file, 'utf8')).toBe(text);
    expect(readdirSync(dir)).toEqual(['d.yaml']);
  });

  it('refuses the process card, the --tables file and a hard link to the design', () => {
    const { dir, file } = designCopy();
    const card = join(dir, 'card.yaml');
    copyFileSync(processCard('generic180'), card);
    const before = readFileSync(card, 'utf8');
    const withCard = cli('check', file, '--set', `process=${card}`, '-o', card);
    expect(withCard.code).toBe(2);
    expect(withCard.stderr).toContain(`is an input of this command (${card})`);
    expect(readFileSync(card, 'utf8')).toBe(before);
    const tables = join(dir, 'tables.json');
    copyFileSync(fixture('tables', 'generic180.json'), tables);
    const withTables = cli('check', file, '--tables', tables, '-o', tables);
    expect(withTables.code).toBe(2);
    expect(withTables.stderr).toContain(`is an input of this command (${tables})`);
    expect(readFileSync(tables, 'utf8')).toBe(readFileSync(fixture('tables', 'generic180.json'), 'utf8'));
    const hard = join(dir, 'hard.yaml');
    execFileSync('ln', [file, hard]);
    expect(cli('check', file, '-o', hard).stderr).toContain('is an input of this command');
  });

  it('refuses a Markdown report whose drawings would land on the design, writing nothing', async () => {
    const { dir, file, text } = designCopy();
    const clash = join(dir, 'r-worst.svg');
    symlinkSync(file, clash);
    const r = await cliAsync('report', file, '--no-fmax', '--no-tune', '--format', 'md', '-o', join(dir, 'r.md'));
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(`--out: "${clash}" is a symbolic link`);
    expect(readdirSync(dir).sort()).toEqual(['d.yaml', 'r-worst.svg']);
    expect(readFileSync(file, 'utf8')).toBe(text);
  });
});

describe('checkOutput', () => {
  it('accepts stdout, a new file and an existing regular file that is no input', () => {
    const dir = tempDir();
    const existing = join(dir, 'old.csv');
    writeFileSync(existing, 'x');
    for (const out of [undefined, '-', join(dir, 'new.csv'), existing]) expect(() => checkOutput(out, [design('doubler')])).not.toThrow();
    expect(() => checkOutput(existing, [existing], '--histogram')).toThrow(InputError);
  });
});

describe('writeFileAtomic', () => {
  it('replaces a file through a temp file, keeping its permission bits and leaving no temp behind', () => {
    const dir = tempDir();
    const file = join(dir, 'private.json');
    writeFileSync(file, 'old');
    chmodSync(file, 0o600);
    writeFileAtomic(file, 'new');
    expect(readFileSync(file, 'utf8')).toBe('new');
    expect(statSync(file).mode & 0o777).toBe(0o600);
    expect(readdirSync(dir)).toEqual(['private.json']);
    expect(existsSync(join(dir, '.private.json.tmp'))).toBe(false);
  });
});
