/**
 * Characterizing switch on-resistance at a corner: one n and one p device of the card's minimum
 * length, gate at the full supply, source and body at their rail, drain RON_VDS (1 mV) away (deep
 * triode); R_on * W/L is written to the tables, where the table model calibrates the triode law with
 * it. (fixtures/tables/ were characterized with the drain 10 mV away, which reads R_on up to 2.6 %
 * high on generic-lp: conservative; re-characterize to drop it.)
 */
import type { Corner } from '../process/corner.js';
import type { ProcessCard } from '../schema/process.js';
import type { CornerRon } from '../schema/tables.js';
import { mosfet } from './cells.js';
import { cornerModels } from './models.js';
import { spiceNumber } from './names.js';
import { spiceComment } from './text.js';
import { RON_VDS } from './ron-bench.js';

/** Width of the characterized devices, in units of the card's minimum length. */
const ASPECT = 50;

export interface RonDeck {
  readonly text: string;
  readonly names: readonly string[];
  /** W/L of both devices. */
  readonly aspect: number;
}

export function ronCharacterizationDeck(
  card: ProcessCard,
  corner: Pick<Corner, 'name' | 'process' | 'vdd' | 'temperature'>,
  modelPath: string,
): RonDeck {
  const models = cornerModels(card, corner, modelPath);
  const vdd = spiceNumber(corner.vdd);
  const w = ASPECT * card.lmin;
  const geo = { ...models.geometry, l: card.lmin };
  const lines = [
    spiceComment(`phasegap on-resistance characterization: ${card.name} at ${corner.name}, W/L ${ASPECT}, V_DS ${spiceNumber(RON_VDS)} V`),
    ...models.header,
    `vgn gn 0 DC ${vdd}`,
    `vdn dn 0 DC ${spiceNumber(RON_VDS)}`,
    mosfet('mn', 'dn', 'gn', '0', '0', models.geometry.nModel, w, geo),
    `vsp sp 0 DC ${vdd}`,
    `vdp dp 0 DC ${spiceNumber(corner.vdd - RON_VDS)}`,
    mosfet('mp', 'dp', '0', 'sp', 'sp', models.geometry.pModel, w, geo),
    '.tran 1p 2p',
    '.meas tran ron_in FIND i(vdn) AT=2p',
    '.meas tran ron_ip FIND i(vdp) AT=2p',
    '.end',
    '',
  ];
  return { text: lines.join('\n'), names: ['ron_in', 'ron_ip'], aspect: ASPECT };
}

/** R_on * W/L of both devices from the measured currents, or why they are missing. */
export function cornerRonFrom(deck: RonDeck, values: ReadonlyMap<string, number | null>): CornerRon | string {
  const r = (name: string): number | string => {
    const i = values.get(name);
    return i === null || i === undefined || !Number.isFinite(i) || i === 0
      ? `${name} was not measured`
      : (RON_VDS / Math.abs(i)) * deck.aspect;
  };
  const n = r('ron_in');
  const p = r('ron_ip');
  if (typeof n === 'string') return n;
  if (typeof p === 'string') return p;
  return { n, p };
}
