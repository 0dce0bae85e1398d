/**
 * A design whose every name tries to break out of the output it is written into, built past the
 * schema (which refuses such names) so the output writers are tested on their own.
 */
import { join } from 'node:path';
import { loadProcess } from '../../src/cli/load.js';
import { resolveDesign, type ResolvedDesign } from '../../src/analysis/resolve.js';
import type { Design } from '../../src/schema/design.js';
import type { ProcessCard } from '../../src/schema/process.js';
import { designFromYaml, processCard } from '../helpers.js';

/** Text that would run `touch MARKER` if a deck took it for lines of its own (ngspice .control, *# lines). */
export function hostileName(marker: string, tag: string): string {
  return (
    `${tag}\n.control\nshell touch ${marker}\n.endc\r\n*# shell touch ${marker}\u2028.end\u0085` +
    `$$end $end endmodule\nmodule evil; initial $display("EVIL"); endmodule\n// <script>alert(1)</script>` +
    `]]>&\u0001\u000b\u007f\u009b\u202e\u2066\ufffe\ud800`
  );
}

/** A small netlist design on the generic180 card, valid as it stands. */
export const PLAIN_YAML = `
name: plain
process: ${processCard('generic180')}
clock: { frequency: 20MHz, transition: 100ps }
generator:
  template: netlist
  clock: clk
  phases: [p1, p2]
  gates:
    - { name: g_inv,  cell: INV,   size: 1, inputs: [clk], output: clkb }
    - { name: g_nand1, cell: NAND2, size: 1, inputs: [clk, f2], output: x1 }
    - { name: g_nand2, cell: NAND2, size: 1, inputs: [clkb, f1], output: x2 }
    - { name: g_d1, cell: BUF, size: 1, inputs: [x1], output: f1 }
    - { name: g_d2, cell: BUF, size: 1, inputs: [x2], output: f2 }
    - { name: g_o1, cell: INV, size: 4, inputs: [f1], output: p1 }
    - { name: g_o2, cell: INV, size: 4, inputs: [f2], output: p2 }
loads: { p1: 100fF, p2: 100fF }
switches:
  - { name: sa, type: nmos, w: 4um, l: 0.18um, gate: p1, signal: 0V }
  - { name: sb, type: nmos, w: 4um, l: 0.18um, gate: p2, signal: 0V }
constraints:
  breakBeforeMake: [{ name: handover, between: [sa, sb] }]
  settle: [{ name: sampling, switches: [sa], capacitance: 1pF, bits: 8 }]
corners: { process: [tt], vdd: [1.8V], temperature: [27] }
`;

/** The plain design of this file with every name (design, gates, switches, constraints, card, corner) hostile. */
export function hostileResolved(marker: string): ResolvedDesign {
  const plain = designFromYaml(PLAIN_YAML);
  const name = (tag: string) => hostileName(marker, tag);
  const gen = plain.generator;
  if (gen.template !== 'netlist') throw new Error('netlist expected');
  const [sa, sb] = [name('sa'), name('sb')];
  const design: Design = {
    ...plain,
    name: name('design'),
    description: name('description'),
    generator: { ...gen, gates: gen.gates.map((g) => ({ ...g, name: name(g.name) })) },
    switches: plain.switches.map((s, i) => ({ ...s, name: i === 0 ? sa : sb })),
    constraints: {
      breakBeforeMake: [{ name: name('bbm'), between: [sa, sb] }],
      order: [],
      settle: plain.constraints.settle.map((s) => ({ ...s, name: name('settle'), switches: [sa] })),
    },
    corners: { process: [name('corner')], vdd: [1.8], temperature: [27] },
  };
  const base = loadProcess(processCard('generic180'));
  const card: ProcessCard = {
    ...base,
    name: name('card'),
    description: name('card description'),
    corners: { [name('corner')]: base.corners.tt! },
    spice: { ...base.spice!, models: join('..', 'models', 'generic180.lib'), corners: { [name('corner')]: { params: {} } } },
  };
  return resolveDesign(design, card);
}
