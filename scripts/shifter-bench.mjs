// The level-shifter fit scripts' shared bench: the output's delay and 10-90 % transition
// measurements, and one ngspice run of a deck with its .meas results read back.
import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { SHAPE_LEVELS } from '../dist/src/switches/shifter-shape.js';

/**
 * .meas lines for the output's rising and falling delays from the input's 50 % point to the
 * output's mid-swing, and its 10-90 % transitions, all after `from` (s). The output rises when the
 * input rises (falls when `invert`).
 */
export function edgeMeasures({ vdd, low, high, invert, from }) {
  const mid = (low + high) / 2;
  const swing = high - low;
  const w = `TD=${from}`;
  return [
    `.meas tran d_rise TRIG v(in) VAL=${vdd / 2} ${invert ? 'FALL' : 'RISE'}=1 ${w} TARG v(out) VAL=${mid} RISE=1 ${w}`,
    `.meas tran d_fall TRIG v(in) VAL=${vdd / 2} ${invert ? 'RISE' : 'FALL'}=1 ${w} TARG v(out) VAL=${mid} FALL=1 ${w}`,
    `.meas tran t_rise TRIG v(out) VAL=${low + 0.1 * swing} RISE=1 ${w} TARG v(out) VAL=${low + 0.9 * swing} RISE=1 ${w}`,
    `.meas tran t_fall TRIG v(out) VAL=${low + 0.9 * swing} FALL=1 ${w} TARG v(out) VAL=${low + 0.1 * swing} FALL=1 ${w}`,
  ];
}

/** Writes the deck to `file`, runs it in ngspice and returns a reader of its .meas results (NaN when absent). */
export function simulate(file, deck) {
  writeFileSync(file, deck);
  const run = spawnSync('ngspice', ['-b', file], { encoding: 'utf8' });
  return (name) => {
    const m = new RegExp(`^${name}\\s*=\\s*(\\S+)`, 'm').exec(run.stdout);
    return m ? Number(m[1]) : Number.NaN;
  };
}

/** The edges edgeMeasures() asked for: delays and full-swing transitions (10-90 % over 0.8), s. */
export function edges(value) {
  return {
    rise: value('d_rise'),
    fall: value('d_fall'),
    tRise: value('t_rise') / 0.8,
    tFall: value('t_fall') / 0.8,
  };
}

/** Levels of the output edge whose crossings shapeMeasures() asks for: the ones the model's shape fits give. */
export { SHAPE_LEVELS };

/**
 * .meas lines for the output's crossings of SHAPE_LEVELS and its 50 % point on both edges, and the
 * 10-90 % transitions of the latch node `latch` (0 .. high) that drives the output inverter, all
 * after `from` (s).
 */
export function shapeMeasures({ low, high, latch, from }) {
  const swing = high - low;
  const w = `TD=${from}`;
  const lines = [];
  for (const dir of ['RISE', 'FALL']) {
    const d = dir[0].toLowerCase();
    lines.push(`.meas tran s${d}_mid WHEN v(out)=${low + 0.5 * swing} ${dir}=1 ${w}`);
    for (const [i, f] of SHAPE_LEVELS.entries()) lines.push(`.meas tran s${d}_${i} WHEN v(out)=${low + f * swing} ${dir}=1 ${w}`);
  }
  lines.push(`.meas tran x_fall TRIG v(${latch}) VAL=${0.9 * high} FALL=1 ${w} TARG v(${latch}) VAL=${0.1 * high} FALL=1 ${w}`);
  lines.push(`.meas tran x_rise TRIG v(${latch}) VAL=${0.1 * high} RISE=1 ${w} TARG v(${latch}) VAL=${0.9 * high} RISE=1 ${w}`);
  return lines;
}

/**
 * What shapeMeasures() asked for: per output edge, each level's time from the 50 % point in units of
 * that edge's full-swing transition (10-90 % over 0.8), and the latch node's full-swing transitions
 * (its fall drives the output's rise), s.
 */
export function shape(value, { tRise, tFall }) {
  const lags = (d, t) => SHAPE_LEVELS.map((_, i) => (value(`s${d}_${i}`) - value(`s${d}_mid`)) / t);
  return {
    riseLags: lags('r', tRise),
    fallLags: lags('f', tFall),
    latchFall: value('x_fall') / 0.8,
    latchRise: value('x_rise') / 0.8,
  };
}
