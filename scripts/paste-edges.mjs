// Writes a CORNERS=1 run of shifter-fit.mjs (its { grounded, floating } edge fits) into the two
// `edges` blocks of src/switches/shifter-sizing.ts, GROUNDED's first and FLOATING's second, in the
// file's number format (the first coefficient of each set in picoseconds, five significant
// figures; shape levels to four places). A fitted coefficient that reads like one of Math's
// constants gets the comment the linter asks for. Run `npx biome format --write` afterwards.
import { readFileSync, writeFileSync } from 'node:fs';

const MATH_CONSTANTS = [Math.E, Math.LN10, Math.LN2, Math.LOG10E, Math.LOG2E, Math.PI, Math.SQRT1_2, Math.SQRT2];

/** True when the printed number `text` is a prefix or a rounding of one of Math's constants (at least 3 decimals). */
function readsLikeConstant(text) {
  const digits = text.replace(/^-/, '');
  const decimals = digits.split('.')[1]?.length ?? 0;
  if (decimals < 3) return false;
  return MATH_CONSTANTS.some((c) => String(c).startsWith(digits) || c.toFixed(decimals) === digits);
}

const coefficient = (c, i) => (i === 0 && Math.abs(c) < 1e-9 ? `${+(c * 1e12).toPrecision(5)}e-12` : `${+c.toPrecision(5)}`);
const list = (a) => `[${a.map(coefficient).join(', ')}]`;

function levelLine(level, indent) {
  const numbers = (level.coef ?? level).map((x) => String(+x.toFixed(4)));
  const line = `${indent}[${numbers.join(', ')}],`;
  return numbers.some(readsLikeConstant)
    ? `${indent}// biome-ignore lint/suspicious/noApproximativeNumericConstant: a fitted coefficient, not Math's constant\n${line}`
    : line;
}

function shapeBlock(shape, indent) {
  const ratio = shape.ratio.map((x) => +x.toFixed(2)).join(', ');
  const levels = shape.levels.map((l) => levelLine(l, `${indent}    `)).join('\n');
  return `{\n${indent}  ratio: [${ratio}],\n${indent}  levels: [\n${levels}\n${indent}  ],\n${indent}}`;
}

function edgesBlock(g) {
  return [
    '  edges: {',
    `    fall: ${list(g.fall.coef)},`,
    `    rise: ${list(g.rise.coef)},`,
    `    edgeTransitionRise: ${list(g.edgeTransitionRise.coef)},`,
    `    edgeTransitionFall: ${list(g.edgeTransitionFall.coef)},`,
    `    latchFall: ${list(g.latchFall.coef)},`,
    `    latchRise: ${list(g.latchRise.coef)},`,
    `    riseShape: ${shapeBlock(g.riseShape, '    ')},`,
    `    fallShape: ${shapeBlock(g.fallShape, '    ')},`,
    '  },',
    '};',
  ].join('\n');
}

/** Replaces the `edges` blocks of the fits module at `path` with `fits` ({ grounded, floating }). */
export function pasteEdges(fits, path) {
  const source = readFileSync(path, 'utf8');
  const block = / {2}edges: \{\n[\s\S]*?\n {2}\},\n\};/g;
  const found = source.match(block)?.length ?? 0;
  if (found !== 2) throw new Error(`${path}: expected 2 edges blocks (GROUNDED, FLOATING), found ${found}`);
  let i = 0;
  writeFileSync(
    path,
    source.replace(block, () => edgesBlock(i++ === 0 ? fits.grounded : fits.floating)),
  );
}
