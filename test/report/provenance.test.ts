import { describe, expect, it } from 'vitest';
import { commandText, provenance, provenanceLines } from '../../src/report/provenance.js';

const facts = {
  version: '9.9.9',
  now: new Date(Date.UTC(2026, 0, 2, 3, 4, 5)),
  command: ['check', 'my design.yaml', '--set', 'clock.frequency=40MHz'],
  inputs: [
    { role: 'design', path: 'my design.yaml', sha256: 'a'.repeat(64) },
    { role: 'process card', path: 'card.yaml', sha256: 'b'.repeat(64) },
  ] as const,
  model: 'table',
};

describe('provenance', () => {
  it('records the date from the given clock in ISO 8601 UTC, and no simulator or error band unless given', () => {
    const p = provenance(facts);
    expect(p).toEqual({
      tool: 'phasegap',
      version: '9.9.9',
      date: '2026-01-02T03:04:05.000Z',
      command: facts.command,
      inputs: facts.inputs,
      model: { name: 'table', errorBand: null },
      simulator: null,
    });
  });

  it('commandText quotes words a shell would split', () => {
    expect(commandText(provenance(facts))).toBe("phasegap check 'my design.yaml' --set clock.frequency=40MHz");
  });

  it('provenanceLines gives version and date, command, each input with its hash, the model and the simulator', () => {
    const p = provenance({ ...facts, simulator: 'ngspice-42', errorBand: { relative: 0.042, source: 'confirm at 45 corners' } });
    expect(provenanceLines(p)).toEqual([
      'phasegap 9.9.9, 2026-01-02T03:04:05.000Z',
      "command: phasegap check 'my design.yaml' --set clock.frequency=40MHz",
      `design: my design.yaml sha256 ${'a'.repeat(64)}`,
      `process card: card.yaml sha256 ${'b'.repeat(64)}`,
      'delay model: table, measured error within 4.2 % (confirm at 45 corners)',
      'simulator: ngspice-42',
    ]);
    expect(provenanceLines(provenance(facts))[4]).toBe('delay model: table, error band not measured');
  });
});
