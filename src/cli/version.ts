/** The tool's version, read once from its package.json: the one place it is written. */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

/** Walks up from this module (src/cli or dist/src/cli) to the package.json named phasegap. */
function readVersion(): string {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    try {
      const pkg = JSON.parse(readFileSync(join(dir, 'package.json'), 'utf8')) as { name?: unknown; version?: unknown };
      if (pkg.name === 'phasegap' && typeof pkg.version === 'string') return pkg.version;
    } catch {
      // no package.json here: look one folder up
    }
    const up = dirname(dir);
    if (up === dir) throw new Error('phasegap: package.json not found above the installed program');
    dir = up;
  }
}

export const VERSION = readVersion();
