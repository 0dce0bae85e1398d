/**
 * A design whose names carry ngspice commands, written past the schema: the deck keeps them in
 * comments, and ngspice (Debian package ngspice) runs the deck without running them.
 */
import { describe, expect, it } from 'vitest';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { fixture, tempDir } from '../helpers.js';
import { generatorDeck } from '../../src/spice/deck.js';
import { runDecks } from '../../src/spice/runner.js';
import { parseSimulatorOutput } from '../../src/spice/results.js';
import { hostileResolved } from '../schema/hostile.js';
import { requireTool } from '../tools.js';

requireTool('ngspice', 'ngspice');

const MODELS = fixture('models', 'generic180.lib');

describe('generatorDeck with hostile names', () => {
  const marker = join(tempDir(), 'ran');
  const resolved = hostileResolved(marker);
  const deck = generatorDeck(resolved, resolved.corners[0]!.corner, { modelPath: MODELS });
  const lines = deck.text.split('\n');

  it('writes no line that starts a control block, a shell command, a *# command or an early .end', () => {
    expect(lines.filter((l) => /^\s*(\.control|\.endc|shell|\*#)/i.test(l))).toEqual([]);
    expect(lines.filter((l) => /^\s*\.end\b/i.test(l))).toEqual(['.end']);
    expect(lines.filter((l) => l.includes('shell touch')).every((l) => l.startsWith('* ') || / \$ /.test(l))).toBe(true);
  });

  it('writes printable ASCII only, in lines separated by line feeds alone', () => {
    expect(deck.text).toMatch(/^[\x20-\x7e\n]*$/);
  });

  it('runs in ngspice with every measurement and without running the names (Debian package ngspice)', () => {
    const [out] = runDecks([{ name: 'hostile', text: deck.text }], { parallel: 1 });
    const parsed = parseSimulatorOutput(
      out!.output,
      deck.quantities.map((q) => q.name),
    );
    expect(parsed.errors).toEqual([]);
    for (const q of deck.quantities) expect(parsed.values.get(q.name), q.name).not.toBeNull();
    expect(existsSync(marker)).toBe(false);
  });

  it('would run a .control block that reached a line of its own: the check above can fail (ngspice)', () => {
    const control = join(tempDir(), 'control-ran');
    const text = ['* control', 'v1 a 0 1', 'r1 a 0 1k', '.control', `shell touch ${control}`, '.endc', '.op', '.end', ''].join('\n');
    runDecks([{ name: 'control', text }], { parallel: 1 });
    expect(existsSync(control)).toBe(true);
  });
});
