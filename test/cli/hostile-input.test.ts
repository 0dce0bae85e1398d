/**
 * Hostile input through the CLI: a design, process card, table file or --set option crafted to
 * crash the tool, leak another file's content or exhaust memory gets exit 2 and a short message
 * naming the file or field and the bound, never a stack trace.
 */
import { describe, it, expect } from 'vitest';
import { execFileSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse as parseYaml } from 'yaml';
import { cli, cliAsync, design, processCard, tempDir, type CliRun } from '../helpers.js';

const CARD = processCard('generic180');

/** The demo design with its card path made absolute, so it can be written anywhere. */
function demo(): Record<string, unknown> {
  const data = parseYaml(readFileSync(design('doubler'), 'utf8')) as Record<string, unknown>;
  return { ...data, process: CARD };
}

function write(name: string, text: string): string {
  const path = join(tempDir(), name);
  writeFileSync(path, text);
  return path;
}

/** The demo design pointing at `card` as its process card. */
function designWithCard(card: string): string {
  return write('design.yaml', readFileSync(design('doubler'), 'utf8').replace(/^process: .*$/m, `process: ${card}`));
}

function refused(run: CliRun): string {
  expect(run.code).toBe(2);
  expect(run.stdout).toBe('');
  expect(run.stderr).toMatch(/^phasegap: error: /);
  expect(run.stderr).not.toMatch(/^\s+at /m);
  expect(run.stderr).not.toContain('internal error');
  return run.stderr;
}

describe('YAML aliases', () => {
  it('refuses an alias with no anchor, naming the file, line and column', () => {
    const path = write('alias.yaml', 'name: x\nclock: *nope\n');
    expect(refused(cli('check', path))).toBe(
      `phasegap: error: ${path}: is not valid YAML or JSON at line 2, column 8: alias *nope has no anchor of that name before it\n`,
    );
  });

  it('refuses an alias bomb (nine levels of ten aliases: 10^9 nodes) before expanding it', () => {
    const lines = ['a0: &a0 [x, x, x, x, x, x, x, x, x, x]'];
    for (let i = 1; i < 10; i++) lines.push(`a${i}: &a${i} [${Array.from({ length: 10 }, () => `*a${i - 1}`).join(', ')}]`);
    const path = write('bomb.yaml', `${lines.join('\n')}\nname: x\n`);
    expect(refused(cli('check', path))).toContain(`${path}: uses YAML aliases that expand beyond 1000 nodes`);
  });

  it('refuses an alias inside the node it names', () => {
    const path = write('loop.yaml', 'name: x\nloads: &l { a: *l }\n');
    expect(refused(cli('check', path))).toContain('line 2, column 16: alias *l refers to a node that contains it');
  });
});

describe('duplicate keys', () => {
  it('names the line and column of a repeated YAML key', () => {
    const path = write('dup.yaml', 'name: a\nclock:\n  duty: 0.5\n  duty: 0.4\n');
    expect(refused(cli('check', path))).toContain(
      `${path}: is not valid YAML or JSON at line 4, column 3: duplicate key "duty" in one mapping`,
    );
  });

  it('names the line and column of a repeated JSON key', () => {
    const path = write('dup.json', '{\n  "name": "a",\n  "name": "b"\n}\n');
    expect(refused(cli('check', path))).toContain(`${path}: is not valid JSON at line 3, column 3: duplicate key "name" in one object`);
  });
});

describe('size and shape limits', () => {
  it('refuses a YAML design larger than 1 MiB before parsing it', () => {
    const path = write('big.yaml', `name: x\n${'# padding\n'.repeat(110_000)}`);
    expect(refused(cli('check', path))).toContain(
      `DESIGN: "${path}" is larger than 1 MiB, the limit for a YAML design or process card (a JSON one may have 16 MiB)`,
    );
  });

  it('refuses a mapping of 20000 keys, naming the field and the limit of 10000', () => {
    const loads = Array.from({ length: 20_000 }, (_, i) => `  n${i}: 1fF`).join('\n');
    const path = write('keys.yaml', `name: x\nloads:\n${loads}\n`);
    expect(refused(cli('check', path))).toBe('phasegap: error: loads: has 20000 keys; a mapping may hold at most 10000\n');
  });

  it('refuses a list of 1,000,000 supplies, naming the field and the limit of 100000', () => {
    const data = demo();
    const path = write('million.json', JSON.stringify({ ...data, corners: { vdd: Array.from({ length: 1_000_000 }, () => '1.8V') } }));
    expect(refused(cli('check', path))).toBe('phasegap: error: corners.vdd: has 1000000 items; a list may hold at most 100000\n');
  });

  it.each([
    ['corners.vdd', { corners: { vdd: Array.from({ length: 1001 }, () => '1.8V') } }, 'corners.vdd: has 1001 items; at most 1000 allowed'],
    [
      'switches',
      {
        switches: Array.from({ length: 1001 }, (_, i) => ({ name: `s${i}`, type: 'nmos', w: '1um', l: '1um', gate: 'p1' })),
        constraints: {},
      },
      'switches: has 1001 items; at most 1000 allowed',
    ],
  ])('refuses %s beyond its schema bound', (_field, edit, expected) => {
    const path = write('long.json', JSON.stringify({ ...demo(), ...edit }));
    expect(refused(cli('check', path))).toContain(expected);
  });

  it('refuses a netlist of 6000 gates, naming the limit of 5000', () => {
    const gates = Array.from({ length: 6000 }, (_, i) => ({
      name: `u${i}`,
      cell: 'INV',
      inputs: [i === 0 ? 'clk' : `n${i - 1}`],
      output: `n${i}`,
    }));
    const path = write('gates.json', JSON.stringify({ ...demo(), generator: { template: 'netlist', phases: ['n1', 'n2'], gates } }));
    expect(refused(cli('check', path))).toContain('generator.gates: has 6000 items; at most 5000 allowed');
  });

  it('refuses a corner grid of more than 10000 corners before expanding it', () => {
    const axis = (n: number, f: (i: number) => unknown) => Array.from({ length: n }, (_, i) => f(i));
    const corners = { process: ['tt'], vdd: axis(200, (i) => 1.5 + i / 1000), temperature: axis(100, (i) => i) };
    const path = write('grid.json', JSON.stringify({ ...demo(), corners }));
    expect(refused(cli('check', path))).toContain('corners: "1 x 200 x 100 x 1 = 20000 corners" is more than 10000 corners');
  });

  it('refuses nesting deeper than 32 levels', () => {
    const path = write(
      'deep.json',
      JSON.stringify({ ...demo(), description: JSON.parse(`${'['.repeat(40)}${']'.repeat(40)}`) as unknown }),
    );
    const stderr = refused(cli('check', path));
    expect(stderr).toMatch(/is not valid JSON at line 1, column \d+: nests deeper than 32 levels/);
  });

  it('refuses YAML sets and timestamps as not plain data', () => {
    const path = write('set.yaml', 'name: x\ndescription: !!set { a, b }\n');
    expect(refused(cli('check', path))).toContain('description: is not plain data');
  });
});

describe('files that are not regular files', () => {
  it('refuses /dev/zero as a process card without reading it', () => {
    const path = designWithCard('/dev/zero');
    expect(refused(cli('check', path))).toBe(
      'phasegap: error: process: "/dev/zero" is not a regular file (it is a device, pipe or socket); phasegap reads only regular files\n',
    );
  });

  it('refuses a named pipe as a design without waiting for a writer', () => {
    const path = join(tempDir(), 'fifo.yaml');
    execFileSync('mkfifo', [path]);
    expect(refused(cli('check', path))).toContain(`DESIGN: "${path}" is not a regular file`);
  });

  it('refuses a folder as a process card', () => {
    const dir = tempDir();
    const path = designWithCard(dir);
    expect(refused(cli('check', path))).toContain(`process: "${dir}" is a directory, not a file`);
  });
});

describe('a foreign file named as a process card or table file', () => {
  const SHADOW = [
    'root:$6$Qw8r1xTz$Zk3p0lYHnq9Tn0V1bq2cX8yA7sFj4mL6Hr:19700:0:99999:7:::',
    'daemon:*:19700:0:99999:7:::',
    'alice:$6$Mn2v8cQe$Yt7uR4wE1qP0oI9uH6gF3dS5aZ2xC8vB:19701:0:99999:7:::',
  ];

  it.each([
    ['shadow lines', SHADOW.join('\n'), ['Qw8r1xTz', 'Zk3p0lYHnq9', 'Mn2v8cQe', 'Yt7uR4wE1qP0', 'root', 'daemon', 'alice']],
    [
      'a configuration mapping',
      'user: alice\npassword: Zk3p0lYHnq9Tn0V1\nhost: db.internal\nname: prod\n',
      ['alice', 'password', 'Zk3p0lYHnq9', 'db.internal', 'prod'],
    ],
    ['a list', '- Zk3p0lYHnq9Tn0V1\n- Yt7uR4wE1qP0oI9u\n', ['Zk3p0lYHnq9', 'Yt7uR4wE1qP0']],
  ])('says %s is not a process card and repeats none of it', (_what, text, secrets) => {
    const card = write('card.yaml', `${text}\n`);
    const path = designWithCard(card);
    const stderr = refused(cli('check', path));
    expect(stderr).toBe(
      `phasegap: error: ${card}: is not a process card (expected a mapping with keys name, description, t0, lmin, vddNominal, unit, n, p, avtConvention, corners, spice, tables); its content is not shown\n`,
    );
    for (const secret of secrets) expect(stderr).not.toContain(secret);
  });

  it('repeats nothing of shadow lines written as YAML keys, which are not valid YAML', () => {
    const card = write('card.yaml', `${SHADOW.map((l) => l.replace(':', ': ')).join('\n')}\n`);
    const path = designWithCard(card);
    const stderr = refused(cli('check', path));
    expect(stderr).toBe(
      `phasegap: error: ${card}: is not valid YAML or JSON at line 1, column 7: block as implicit key (the file's text is not shown)\n`,
    );
    for (const secret of ['Qw8r1xTz', 'Zk3p0lYHnq9', 'root', 'daemon', '19700']) expect(stderr).not.toContain(secret);
  });

  it('does not quote a syntax error inside a foreign card', () => {
    const card = write('card.yaml', 'secret: "Zk3p0lYHnq9\\qTn0V1"\n');
    const path = designWithCard(card);
    const stderr = refused(cli('check', path));
    expect(stderr).toContain(`${card}: is not valid YAML or JSON at line 1, column`);
    expect(stderr).not.toContain('Zk3p0lYHnq9');
  });

  it('says a foreign file is not a delay-table file', () => {
    const tables = write('tables.json', JSON.stringify({ user: 'alice', token: 'Zk3p0lYHnq9Tn0V1' }));
    const stderr = refused(cli('--tables', tables, 'check', design('doubler')));
    expect(stderr).toContain(`${tables}: is not a delay-table file (phasegap characterize output)`);
    expect(stderr).not.toMatch(/alice|Zk3p0lYHnq9Tn0V1|token/);
  });

  it('names at most three unknown keys of a real card, each cut to 24 characters', () => {
    const extra = ['aaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaa', 'b', 'c', 'd', 'e'].map((k) => `${k}: 1`).join('\n');
    const card = write('card.yaml', `${readFileSync(CARD, 'utf8')}\n${extra}\n`);
    const path = designWithCard(card);
    expect(refused(cli('check', path))).toContain(
      `${card}: unknown keys "aaaaaaaaaaaaaaaaaaaaa...", "b", "c" and 2 more; allowed keys here are name,`,
    );
  });
});

describe('a foreign file named as the SPICE model file', () => {
  it('refuses a card whose spice.models is not a model file before ngspice can echo its lines, and names no line of it', () => {
    const shadow = write('shadow', 'root:$6$Qw8r1xTz$Zk3p0lYHnq9Tn0V1:19700:0:99999:7:::\nerror: Yt7uR4wE1qP0oI9u\n');
    const card = write(
      'card.yaml',
      readFileSync(CARD, 'utf8')
        .replace(/^ {2}models: .*$/m, `  models: ${shadow}`)
        .replace(/^tables: .*$/m, ''),
    );
    const path = designWithCard(card);
    for (const command of [
      ['spice', path, '--corner', 'tt/1.8V/27C', '--model', 'analytic'],
      ['confirm', path, '--corners', 'tt/1.8V/27C', '--model', 'analytic'],
    ]) {
      const stderr = refused(cli(...command));
      expect(stderr).toBe(
        `phasegap: error: process.spice.models: ${JSON.stringify(shadow)} is not a SPICE model file (it has no .model, .subckt or .lib line); its content is not shown\n`,
      );
      for (const secret of ['Qw8r1xTz', 'Zk3p0lYHnq9', 'Yt7uR4wE1qP0']) expect(stderr).not.toContain(secret);
    }
  });

  it('refuses a card whose device model is not defined in its model file (ngspice would stop on the deck)', () => {
    const models = write('models.lib', '* two models\n.model nch nmos level=1\n.model pch pmos level=1\n');
    const card = write(
      'card.yaml',
      readFileSync(CARD, 'utf8')
        .replace(/^ {2}models: .*$/m, `  models: ${models}`)
        .replace(/^ {2}p: pch$/m, '  p: Clk'),
    );
    expect(
      refused(cli('spice', designWithCard(card), '--corner', 'tt/1.8V/27C', '--model', 'analytic', '-o', join(tempDir(), 'x.cir'))),
    ).toBe(`phasegap: error: process.spice.p: "Clk" is not a model or subcircuit of ${models} (it defines nch, pch)\n`);
  });

  it('refuses --models on a device', () => {
    expect(refused(cli('spice', design('doubler'), '--corner', 'tt/1.8V/27C', '--models', '/dev/zero'))).toBe(
      'phasegap: error: --models: "/dev/zero" is not a regular file (it is a device, pipe or socket); phasegap reads only regular files\n',
    );
  });
});

describe('names that are built-in object members', () => {
  const NAMES = ['constructor', 'toString', '__proto__', 'hasOwnProperty'];

  it.each(NAMES)('refuses %s as a process corner of the design', (name) => {
    const path = write('design.json', JSON.stringify({ ...demo(), corners: { process: [name] } }));
    expect(refused(cli('check', path))).toBe(
      `phasegap: error: corners.process[0]: "${name}" is a reserved name (a built-in object member: constructor, prototype, __proto__, toString, ...); choose another name\n`,
    );
  });

  it.each(NAMES)('refuses %s as a phase, a switch or a constraint name given with --set', (name) => {
    for (const [set, at] of [
      [`generator.phases=[${name}, p2]`, 'generator.phases[0]'],
      [`switches[0].name=${name}`, 'switches[0].name'],
      [`constraints.breakBeforeMake[0].name=${name}`, 'constraints.breakBeforeMake[0].name'],
    ] as const) {
      expect(refused(cli('check', design('doubler'), '--set', set))).toContain(`is refused at ${at}: it is a reserved name`);
    }
  });

  it.each(NAMES)('refuses a card that defines a corner named %s', (name) => {
    const card = write(
      'card.json',
      JSON.stringify({
        ...(parseYaml(readFileSync(CARD, 'utf8')) as object),
        spice: undefined,
        corners: JSON.parse(`{"tt": {}, "${name}": {}}`) as unknown,
      }),
    );
    expect(refused(cli('check', designWithCard(card)))).toContain(`corners.${name}: uses the reserved key "${name}"`);
  });

  it.each(NAMES)('says a swept process corner %s is not on the card', async (name) => {
    const run = await cliAsync('sweep', design('doubler'), '--vary', `process=tt,${name}`, '--workers', '1');
    expect(run.code).toBe(2);
    expect(run.stderr).toContain(`"${name}" is not a process corner of card "generic180"; it defines tt, ss, ff, fs, sf`);
    expect(run.stderr).not.toContain('internal error');
  });
});

describe('--set', () => {
  it.each(['__proto__.x=1', 'constructor.prototype.x=1', 'loads.__proto__.x=1', 'corners.prototype=1'])(
    'refuses %s and pollutes no prototype',
    (set) => {
      expect(refused(cli('check', design('doubler'), '--set', set))).toContain('names the reserved key');
      expect(({} as Record<string, unknown>).x).toBeUndefined();
    },
  );

  it('refuses a list index of 100000000 before it reaches the list', () => {
    const stderr = refused(cli('check', design('doubler'), '--set', 'corners.vdd[100000000]=1V'));
    expect(stderr).toBe(
      'phasegap: error: --set: "corners.vdd[100000000]=1V" has list index 100000000; a list holds at most 100000 items\n',
    );
  });

  it('refuses an index more than one past the end of the list', () => {
    expect(refused(cli('check', design('doubler'), '--set', 'corners.vdd[7]=1V'))).toContain(
      'sets item [7] of corners.vdd, which has 3 items; give an index from 0 to 3 (the last appends)',
    );
  });

  it('refuses a value with an alias bomb', () => {
    const bomb = `[${Array.from({ length: 8 }, (_, i) => `&a${i} [${i === 0 ? 'x, x, x, x, x, x, x, x, x, x' : Array.from({ length: 10 }, () => `*a${i - 1}`).join(', ')}]`).join(', ')}]`;
    expect(refused(cli('check', design('doubler'), '--set', `description=${bomb}`))).toContain(
      'has a value that is not a YAML scalar, list or mapping',
    );
  });
});

describe('error output', () => {
  it('prints the first 20 problems and counts the rest', () => {
    const stderr = refused(
      cli('check', design('doubler'), '--set', `corners.vdd=[${Array.from({ length: 30 }, () => 'fast').join(', ')}]`),
    );
    const lines = stderr.trimEnd().split('\n');
    expect(lines).toHaveLength(21);
    expect(lines[0]).toMatch(/^phasegap: error: corners\.vdd\[0\]: "fast"/);
    expect(lines[19]).toMatch(/^phasegap: error: corners\.vdd\[19\]: "fast"/);
    expect(lines[20]).toBe('phasegap: error: ... and 10 more');
  });

  it('cuts a long string value short', () => {
    const stderr = refused(cli('check', design('doubler'), '--set', `clock.frequency=${'9'.repeat(200)}MHzz`));
    expect(stderr).toContain(`clock.frequency: "${'9'.repeat(95)}..."`);
    expect(stderr).not.toContain('9'.repeat(96));
  });
});

describe('free-form netlists with BUF cells', () => {
  it('names the gate the user wrote, not its expanded inverter', () => {
    const stderr = refused(cli('check', design('lp-netlist'), '--set', 'generator.gates[10].inputs=[f9]'));
    expect(stderr).toContain('generator.gates[10].inputs[0]: "f9" is not driven by any gate');
  });
});
