import { describe, expect, it } from 'vitest';
import { renderHistogram } from '../../src/render/svg/histogram.js';
import { histogramOf } from '../../src/variation/histogram.js';
import { all, parseSvg } from './svg-dom.js';

/** Tick labels of the one panel of a histogram over `values` in `unit`. */
function tickLabels(values: readonly number[], unit: 'C' | ''): string[] {
  const svg = parseSvg(
    renderHistogram({ title: 't', subtitle: 's', unit, series: [{ label: 'x', histogram: histogramOf(Float64Array.from(values)) }] }),
  );
  return all(svg, 'text')
    .map((t) => t.textContent ?? '')
    .filter((t) => /^-?[\d.]+ (%|[fpn]?C)$/.test(t));
}

describe('renderHistogram for circuit margins', () => {
  it('labels a fraction in percent with digits enough to tell ticks a hundred-thousandth apart', () => {
    // Efficiency margins of dies 0.10787 .. 0.10791: a spread of 4e-5 (0.004 percentage points).
    const labels = tickLabels([0.10787, 0.10788, 0.10789, 0.1079, 0.10791], '');
    expect(labels.length).toBeGreaterThan(2);
    expect(new Set(labels).size).toBe(labels.length);
    // Ticks 1e-5 apart (0.001 percentage points) need three decimals.
    expect(labels).toContain('10.788 %');
  });

  it('labels charge with an engineering prefix', () => {
    const labels = tickLabels([0.2e-12, 0.4e-12, 0.6e-12, 0.8e-12], 'C');
    expect(labels).toContain('400 fC');
    expect(new Set(labels).size).toBe(labels.length);
  });
});
