import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT } from './helpers.js';

describe('the README quick start', () => {
  const readme = readFileSync(join(ROOT, 'README.md'), 'utf8');
  const section = readme.slice(readme.indexOf('## Quick start'), readme.indexOf('## A tour of the commands'));
  const commands = /```sh\n([\s\S]*?)```/
    .exec(section)![1]!
    .trim()
    .split('\n')
    .map((l) => l.replace(/\s+#.*$/, ''));

  it('is two commands: the demo through npx, then the set-up and test script as root', () => {
    expect(commands).toEqual(['npm ci && npx phasegap check fixtures/designs/doubler.yaml', 'sudo bash .ci/run']);
  });

  it("runs this folder's own bin with npx phasegap (npm 10, as shipped with Node 20)", () => {
    const version = (JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { version: string }).version;
    const out = execFileSync('npx', ['--offline', 'phasegap', '--version'], { cwd: ROOT, encoding: 'utf8', timeout: 600_000 });
    expect(out.trim()).toBe(version);
  }, 600_000);
});
