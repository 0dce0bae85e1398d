// The level-shifter fit scripts' shared bench: the output's delay and 10-90 % transition
// measurements, and one ngspice run of a deck with its .meas results read back.
import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';

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
