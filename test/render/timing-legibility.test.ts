/**
 * What keeps the timing diagram readable: labels above every line, failure hatches that let the
 * marked bars show through, a corner-spread style of its own, notes inside their panel, and every
 * failing settle path drawn.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { evaluateAll, type CornerResult } from '../../src/analysis/evaluate.js';
import { resolveDesign, type ResolvedDesign } from '../../src/analysis/resolve.js';
import { loadDesign } from '../../src/cli/load.js';
import { worstCornerIndex } from '../../src/analysis/corner-choice.js';
import { buildDiagram } from '../../src/render/diagram.js';
import { OFF_LABEL_GAP, renderTimingSvg, withoutBusy } from '../../src/render/svg/timing.js';
import { textWidth } from '../../src/render/svg/text.js';
import { design, tempDir } from '../helpers.js';
import { all, parseSvg } from './svg-dom.js';
import { requireTool } from '../tools.js';

requireTool('xmllint', 'libxml2-utils');

function drawn(
  name: string,
  kind: 'corner' | 'all',
  set: string[] = [],
): { svg: string; doc: Element; results: CornerResult[]; resolved: ResolvedDesign } {
  const { design: d, card } = loadDesign(design(name), set);
  const resolved = resolveDesign(d, card);
  const results = evaluateAll(resolved);
  const index = worstCornerIndex(results);
  const svg = renderTimingSvg(buildDiagram(resolved, results, kind === 'corner' ? { kind, index } : { kind, reference: index }, 'phases'));
  return { svg, doc: parseSvg(svg), results, resolved };
}

const num = (e: Element, a: string) => Number(e.getAttribute(a));
/** s_chg's gate swing stops at 1.1 VDD: it never turns on, so its settle path cannot be measured. */
const STUCK = ['switches[1].levelShifter.high=1.1vdd'];

describe('renderTimingSvg labels', () => {
  const { doc } = drawn('doubler', 'all');

  it('puts every dimension label and note on a paper ground in a layer drawn after all mark lines', () => {
    for (const panel of all(doc, 'g.panel-detail-a, g.panel-detail-b')) {
      const children = [...panel.children];
      const layer = children.findIndex((c) => c.getAttribute('class') === 'mark-labels');
      const lastMark = children.map((c) => c.getAttribute('class')).lastIndexOf('bbm-mark');
      expect(layer).toBeGreaterThan(lastMark);
      const texts = all(children[layer]!, 'text');
      expect(texts.length).toBeGreaterThan(4);
      // Each label follows its own ground rect, which spans the label's estimated width.
      for (const t of texts) {
        const ground = t.previousElementSibling!;
        expect(ground.getAttribute('class')).toBe('label-ground');
        expect(ground.getAttribute('fill')).toBe('#ffffff');
        expect(num(ground, 'width')).toBeGreaterThanOrEqual(
          textWidth(t.textContent!, num(t, 'font-size'), t.getAttribute('font-weight') === 'bold'),
        );
      }
    }
  });

  it('draws the axes and their grid lines before the panels, so beneath them', () => {
    const order = [...doc.children].map((c) => c.getAttribute('class') ?? (c.querySelector(':scope > g.time-axis') ? 'axis' : ''));
    const axes = order.flatMap((c, i) => (c === 'axis' ? [i] : []));
    const panels = order.flatMap((c, i) => (c?.startsWith('panel ') ? [i] : []));
    expect(axes).toHaveLength(3);
    axes.forEach((a, k) => {
      expect(a).toBeLessThan(panels[k]!);
    });
  });
});

describe('renderTimingSvg failures and corner spread', () => {
  it('hatches an overlap with open stripes, so both conducting bars stay visible', () => {
    const { doc } = drawn('too-tight', 'corner');
    const fail = all(doc, 'rect.bbm-fail');
    expect(fail.length).toBeGreaterThan(0);
    expect(fail[0]!.getAttribute('fill')).toBe('url(#pg-fail-hatch-open)');
    const pattern = all(doc, 'pattern').find((p) => p.getAttribute('id') === 'pg-fail-hatch-open')!;
    expect(all(pattern, 'rect')).toHaveLength(0);
  });

  it('draws where only some corners conduct as a dashed outline with its own legend entry', () => {
    const { doc } = drawn('doubler', 'all');
    const spread = all(doc, 'rect.conduction-spread');
    expect(spread.length).toBeGreaterThan(0);
    expect(spread.every((r) => r.getAttribute('stroke-dasharray') === '3 2' && r.getAttribute('fill') === '#ffffff')).toBe(true);
    const legend = all(doc, 'g.legend text.legend-label').map((t) => t.textContent);
    expect(legend).toContain('switch conducts at some corners only');
    expect(legend).toContain('at every corner, at some signal level');
    const single = drawn('doubler', 'corner').doc;
    expect(all(single, 'rect.conduction-spread')).toHaveLength(0);
    expect(all(single, 'g.legend text.legend-label').map((t) => t.textContent)).toContain('switch conducts at some signal level');
  });

  it('keeps every legend entry inside the drawing', () => {
    const { doc } = drawn('doubler', 'all');
    const width = num(doc, 'width');
    for (const t of all(doc, 'g.legend text'))
      expect(num(t, 'x') + textWidth(t.textContent!, num(t, 'font-size'))).toBeLessThanOrEqual(width);
  });

  it('keeps a "does not switch" note inside the first panel and the whole text in data-full', () => {
    const { doc } = drawn('doubler', 'corner', STUCK);
    const note = all(doc, 'text.switch-problem')[0]!;
    expect(note.getAttribute('data-full')).toMatch(
      /^\u2715 does not switch at .*: s_chg never conducts at a signal of .* V: its gate swing does not reach the turn-on level$/,
    );
    const shown = note.firstChild!.nodeValue!;
    expect(shown.endsWith('\u2026')).toBe(true);
    expect(all(note, 'title')[0]!.textContent).toBe(note.getAttribute('data-full'));
    const clipB = all(doc, 'clipPath').find((c) => c.getAttribute('id') === 'pg-clip-detail-b')!;
    const right = num(note, 'x') + textWidth(shown, num(note, 'font-size'));
    expect(right).toBeLessThan(num(all(clipB, 'rect')[0]!, 'x'));
  });

  it('draws a settle path that cannot be measured as a failure with its reason', () => {
    const { doc, results } = drawn('doubler', 'corner', STUCK);
    expect(results.some((r) => r.checks.some((c) => c.kind === 'settle' && c.margin === null))).toBe(true);
    const mark = all(doc, 'g.settle-mark.unmeasured')[0]!;
    expect(mark.getAttribute('data-path')).toBe('flying-cap charge');
    expect(all(mark, 'text.settle-label')[0]!.textContent).toMatch(/^flying-cap charge: not measurable at \S+ \u2715 FAIL$/);
    expect(all(mark, 'text.settle-reason')[0]!.textContent).toContain('never conducts');
    expect(all(mark, 'rect.settle-unmeasured')[0]!.getAttribute('fill')).toBe('url(#pg-fail-hatch)');
  });

  it("writes the stuck design's drawing as XML that xmllint (libxml2-utils) accepts", () => {
    const file = join(tempDir(), 'stuck.svg');
    writeFileSync(file, drawn('doubler', 'corner', STUCK).svg);
    const lint = spawnSync('xmllint', ['--noout', '--nonet', file], { encoding: 'utf8' });
    expect(lint.stderr).toBe('');
    expect(lint.status).toBe(0);
  });
});

describe('off-state labels', () => {
  it('keep OFF_LABEL_GAP px from the conduction bars of their lane', () => {
    for (const kind of ['corner', 'all'] as const) {
      const { doc } = drawn('too-tight', kind);
      const overview = all(doc, 'g.panel-overview')[0]!;
      const lanes = all(overview, 'g.switch-lane');
      let labels = 0;
      for (const lane of lanes) {
        const ground = all(lane, 'rect.off-state-label-ground')[0];
        if (!ground) continue;
        labels++;
        const [a, b] = [num(ground, 'x'), num(ground, 'x') + num(ground, 'width')];
        for (const bar of all(lane, 'rect.conduction-wide, rect.conduction-narrow, rect.conduction-spread')) {
          const [c, d] = [num(bar, 'x'), num(bar, 'x') + num(bar, 'width')];
          expect(b <= c - OFF_LABEL_GAP + 0.01 || a >= d + OFF_LABEL_GAP - 0.01, `${kind} ${lane.getAttribute('data-switch')}`).toBe(true);
        }
      }
      expect(labels).toBeGreaterThan(0);
    }
  });

  it('withoutBusy cuts busy intervals out of spans', () => {
    expect(
      withoutBusy(
        [{ xa: 0, xb: 100 }],
        [
          { xa: 20, xb: 30 },
          { xa: 90, xb: 120 },
        ],
      ),
    ).toEqual([
      { xa: 0, xb: 20 },
      { xa: 30, xb: 90 },
    ]);
    expect(withoutBusy([{ xa: 0, xb: 10 }], [{ xa: -5, xb: 15 }])).toEqual([]);
    expect(withoutBusy([{ xa: 0, xb: 10 }], [])).toEqual([{ xa: 0, xb: 10 }]);
  });
});
