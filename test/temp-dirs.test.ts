import { existsSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { tempDir } from './temp-dirs.js';

const shared = tempDir();
let previous = '';

describe('tempDir', () => {
  it('makes a fresh folder inside a test', () => {
    previous = tempDir();
    writeFileSync(join(previous, 'x.txt'), 'x');
    expect(existsSync(join(previous, 'x.txt'))).toBe(true);
  });

  it("has removed the previous test's folder, with its files, once that test ended", () => {
    expect(previous).not.toBe('');
    expect(existsSync(previous)).toBe(false);
  });

  it('keeps a folder made while the file is collected until the file ends', () => {
    expect(existsSync(shared)).toBe(true);
  });
});
