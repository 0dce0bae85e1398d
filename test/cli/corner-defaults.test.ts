import { describe, expect, it } from 'vitest';
import { cli, cliAsync, design, withoutRunRecord } from '../helpers.js';
import { namesCorner } from '../../src/process/corners.js';

const corner = { name: 'tt/1.8V/27C', process: 'tt', vdd: 1.8, temperature: 27, duty: 0.5 };

describe('namesCorner', () => {
  it.each(['tt/1.8V/27C', 'TT/1.80V/27C', 'tt/1.8/27', ' Tt/1800mV/27°C ', 'tt/1.8V/27degC'])('reads %j as tt/1.8V/27C', (text) => {
    expect(namesCorner(text, corner)).toBe(true);
  });

  it.each(['ss/1.8V/27C', 'tt/1.62V/27C', 'tt/1.8V/-40C', 'tt/1.8V', 'tt/1.8V/27C/duty0.5', 'tt/fast/27C', 'tt/1.8V/27C/x/y'])(
    'does not read %j as tt/1.8V/27C',
    (text) => {
      expect(namesCorner(text, corner)).toBe(false);
    },
  );

  it('needs the duty of a corner whose name carries one', () => {
    const withDuty = { ...corner, name: 'tt/1.8V/27C/duty0.47', duty: 0.47 };
    expect(namesCorner('TT/1.8V/27C/DUTY0.47', withDuty)).toBe(true);
    expect(namesCorner('tt/1.8V/27C/duty0.5', withDuty)).toBe(false);
    expect(namesCorner('tt/1.8V/27C', withDuty)).toBe(false);
  });
});

describe('--corner spellings and defaults', () => {
  it('draw, waves and spice take TT/1.80V/27C as tt/1.8V/27C', async () => {
    const draw = await cliAsync('draw', design('doubler'), '--corner', 'TT/1.80V/27C', '-o', '-');
    expect(draw.code).toBe(0);
    expect(draw.stdout).toContain('tt/1.8V/27C');
    const waves = cli('waves', design('doubler'), '--corner', 'TT/1.80V/27C', '-o', '-');
    expect(withoutRunRecord(waves.stdout)).toBe(
      withoutRunRecord(cli('waves', design('doubler'), '--corner', 'tt/1.8V/27C', '-o', '-').stdout),
    );
    const spice = cli('spice', design('doubler'), '--corner', 'TT/1.80V/27C');
    expect(withoutRunRecord(spice.stdout)).toBe(withoutRunRecord(cli('spice', design('doubler'), '--corner', 'tt/1.8V/27C').stdout));
  });

  it.each(['spice', 'verilog'])('%s without --corner writes the worst corner, as draw and waves do', (command) => {
    const plain = cli(command, design('doubler'));
    expect(plain.code).toBe(0);
    expect(plain.stderr).toBe('');
    expect(withoutRunRecord(plain.stdout)).toBe(withoutRunRecord(cli(command, design('doubler'), '--corner', 'worst').stdout));
    expect(withoutRunRecord(plain.stdout)).not.toBe(withoutRunRecord(cli(command, design('doubler'), '--corner', 'tt/1.8V/27C').stdout));
  });
});
