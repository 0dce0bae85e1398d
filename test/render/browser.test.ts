// biome-ignore-all lint/performance/useDomNodeTextContent: innerText is the text as the browser lays it out, which these tests read
/**
 * The review page in a real browser: Debian's chromium driven by playwright-core. It must load
 * with no console error and no failed (or any network) request, lay out every drawing at a
 * non-zero size, and keep every text label of every drawing clear of every other.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type Browser } from 'playwright-core';
import { design, tempDir, cliAsync, resolveYaml } from '../helpers.js';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { buildReportModel } from '../../src/render/report-model.js';
import { renderHtmlReport } from '../../src/render/html/report.js';
import { provenance } from '../../src/report/provenance.js';
import { requireTool } from '../tools.js';

requireTool('chromium', 'chromium');
requireTool('ngspice', 'ngspice');

/** A folder to keep the page screenshots in, when named; the tests write nothing else outside their temp folders. */
const SCREENSHOTS = process.env.PHASEGAP_SCREENSHOTS;

let browser: Browser;

beforeAll(async () => {
  browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
    ],
  });
  // A cold start of the browser on a busy machine can pass vitest's 10 s hook limit; this one stops a hang.
}, 60_000);

afterAll(async () => {
  await browser?.close();
});

interface Overlap {
  readonly svg: string;
  readonly a: string;
  readonly b: string;
}

async function openReport(name: string, extra: string[] = []) {
  const dir = tempDir();
  const file = join(dir, `${name}.html`);
  const run = await cliAsync('report', design(name), ...extra, '-o', file);
  expect([0, 1]).toContain(run.code);
  const page = await browser.newPage({ viewport: { width: 1320, height: 1000 } });
  const problems: string[] = [];
  const requests: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') problems.push(`console: ${m.text()}`);
  });
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('requestfailed', (r) => problems.push(`failed request: ${r.url()}`));
  page.on('request', (r) => requests.push(r.url()));
  const url = pathToFileURL(file).href;
  await page.goto(url, { waitUntil: 'load' });
  return { page, problems, requests, url };
}

describe('report in headless Chromium', () => {
  for (const name of ['doubler', 'sc-integrator', 'too-tight']) {
    it(`${name}: loads cleanly, lays out every drawing and no two labels overlap`, async () => {
      // The failing design's page also carries the ngspice comparison and the tune proposals.
      const confirm = name === 'too-tight';
      const { page, problems, requests, url } = await openReport(name, confirm ? ['--confirm', 'worst'] : []);
      try {
        expect(problems).toEqual([]);
        expect(requests).toEqual([url]);
        const sizes = await page.$$eval('figure svg', (svgs) =>
          svgs.map((s) => {
            const r = s.getBoundingClientRect();
            return { w: r.width, h: r.height };
          }),
        );
        // Worst corner, all corners, margins, and the chart of the searched delay chains.
        expect(sizes.length).toBe(4);
        for (const s of sizes) {
          expect(s.w).toBeGreaterThan(0);
          expect(s.h).toBeGreaterThan(0);
        }
        const overlaps: Overlap[] = await page.$$eval('figure svg', (svgs) => {
          const found: Array<{ svg: string; a: string; b: string }> = [];
          svgs.forEach((svg, k) => {
            const boxes = [...svg.querySelectorAll('text')]
              .filter((t) => (t.textContent ?? '').trim() !== '')
              .map((t) => ({ text: t.textContent ?? '', r: t.getBoundingClientRect() }))
              .filter((b) => b.r.width > 0 && b.r.height > 0);
            for (let i = 0; i < boxes.length; i++) {
              for (let j = i + 1; j < boxes.length; j++) {
                const a = boxes[i]!.r;
                const b = boxes[j]!.r;
                // A shared edge within half a pixel is not an overlap.
                const ix = Math.min(a.right, b.right) - Math.max(a.left, b.left);
                const iy = Math.min(a.bottom, b.bottom) - Math.max(a.top, b.top);
                if (ix > 0.5 && iy > 0.5) found.push({ svg: String(k), a: boxes[i]!.text, b: boxes[j]!.text });
              }
            }
          });
          return found;
        });
        expect(overlaps).toEqual([]);
        // Every table is laid out at a size and fits the page width.
        const tables = await page.$$eval('section table', (ts) =>
          ts.map((t) => {
            const r = t.getBoundingClientRect();
            return { id: t.closest('section')!.id, w: r.width, h: r.height, fits: r.right <= document.documentElement.clientWidth + 0.5 };
          }),
        );
        expect(tables.map((t) => t.id)).toContain('tune');
        if (confirm) expect(tables.filter((t) => t.id === 'confirm').length).toBe(2);
        if (confirm) {
          // ngspice agrees with the model within 10 % at the worst corners of too-tight and on
          // break-before-make at its limiting corner sf/1.8V/125C (model -6.8 ps, ngspice -25.1 ps: both
          // fail), so the page fails on its corner checks alone (measured; with the shifter's edges on the
          // nominal-corner fits the limiting corner was sf/1.62V/125C, where the two disagreed).
          const parts = await page.$$eval('header #verdict-parts li', (lis) =>
            lis.map((li) => `${li.getAttribute('data-part')}: ${li.getAttribute('data-verdict')}`),
          );
          expect(parts).toEqual(['corner checks: fail', 'Monte Carlo yield: not-run', 'simulator agreement: pass']);
          expect(await page.$eval('header .verdict', (v) => v.getAttribute('data-verdict'))).toBe('fail');
        }
        for (const t of tables) expect(t.w > 0 && t.h > 0 && t.fits, t.id).toBe(true);
        const png = await page.screenshot({ fullPage: true });
        if (SCREENSHOTS) {
          mkdirSync(SCREENSHOTS, { recursive: true });
          writeFileSync(join(SCREENSHOTS, `report-${name}.png`), png);
        }
        expect(png.length).toBeGreaterThan(10_000);
      } finally {
        await page.close();
      }
    });
  }

  it('heads a page where Monte Carlo fails with FAIL and shows each part beneath it', async () => {
    // A 979.5 ps minimum holds at every corner of the demo (least dead time 983.1 ps, measured) but 10 of 40
    // dies miss it (seed 1, measured): chosen 3.6 ps below the least dead time so the yield, 75 %, is strictly
    // between 0 and 1 and below the 99 % required (980 ps gives 29 of 40 passing, 979 ps 33 of 40).
    const { page, problems } = await openReport('doubler', [
      '--no-fmax',
      '--no-tune',
      '--mc',
      '40',
      '--seed',
      '1',
      '--set',
      'requirements.deadTime.min=979.5ps',
      '--set',
      'requirements.minYield=0.99',
    ]);
    try {
      expect(problems).toEqual([]);
      const verdict = await page.$eval('header .verdict', (v) => ({
        verdict: v.getAttribute('data-verdict'),
        text: (v as HTMLElement).innerText,
        w: v.getBoundingClientRect().width,
      }));
      expect(verdict.verdict).toBe('fail');
      expect(verdict.text).toMatch(/^✕ FAIL\s+fails: Monte Carlo yield; 45 of 45 corners pass/);
      expect(verdict.w).toBeGreaterThan(0);
      const parts = await page.$$eval('header #verdict-parts li', (lis) =>
        lis.map((li) => {
          const r = li.getBoundingClientRect();
          return {
            part: li.getAttribute('data-part'),
            verdict: li.getAttribute('data-verdict'),
            text: (li as HTMLElement).innerText,
            shown: r.width > 0 && r.height > 0,
          };
        }),
      );
      expect(parts.map((p) => [p.part, p.verdict, p.shown])).toEqual([
        ['corner checks', 'pass', true],
        ['Monte Carlo yield', 'fail', true],
        ['simulator agreement', 'not-run', true],
      ]);
      expect(parts[1]!.text).toBe('Monte Carlo yield: ✕ FAIL: yield 75.0 % over 40 dies at every corner, below the 99.0 % required');
      // Every drawing's title box heads with the run's verdict, not only its own checks'.
      const boxes = await page.$$eval('figure svg .title-block', (gs) =>
        gs.map((g) => [g.querySelector('.verdict')?.textContent, g.querySelector('.verdict-detail')?.textContent]),
      );
      expect(boxes).toEqual([
        ['✕ FAIL', 'Monte Carlo yield fails'],
        ['✕ FAIL', 'Monte Carlo yield fails'],
        ['✕ FAIL', 'Monte Carlo yield fails'],
      ]);
    } finally {
      await page.close();
    }
  });

  it('heads a page where the simulator disagrees with FAIL, the failing part, the drawings and the provenance', async () => {
    // The confirmation data is made up here (ngspice is not run): the simulator gives 440 ps against
    // the 500 ps minimum and one break-before-make pair disagrees.
    const resolved = resolveYaml(readFileSync(design('doubler'), 'utf8'));
    const results = evaluateAll(resolved);
    const confirm = {
      simulator: 'ngspice-test',
      tolerance: 0.1,
      comparisons: [
        {
          corner: 'ff/1.98V/-40C',
          errors: [],
          pass: false,
          ron: [],
          quantities: [
            {
              quantity: 'dead p1->p2',
              kind: 'dead' as const,
              model: 968e-12,
              simulator: 440e-12,
              relativeError: (968 - 440) / 440,
              pass: false,
            },
          ],
          breakBeforeMake: [{ check: 's_gnd/s_vdd break-before-make + 100 ps', model: 4.7e-10, simulator: -2e-11, agrees: false }],
        },
      ],
    };
    const record = provenance({
      version: '0.0.0-test',
      now: new Date(Date.UTC(2026, 0, 1)),
      command: ['report', 'doubler.yaml', '--confirm', 'worst'],
      inputs: [],
      model: 'analytic',
      simulator: 'ngspice-test',
    });
    const model = buildReportModel(resolved, results, {
      processSource: 'fixtures',
      fmax: null,
      fmaxNote: 'skipped',
      confirm,
      provenance: record,
    });
    const file = join(tempDir(), 'disagree.html');
    writeFileSync(file, renderHtmlReport(model));
    const page = await browser.newPage({ viewport: { width: 1320, height: 1000 } });
    try {
      await page.goto(pathToFileURL(file).href, { waitUntil: 'load' });
      expect(await page.$eval('header .verdict', (v) => [v.getAttribute('data-verdict'), (v as HTMLElement).innerText])).toEqual([
        'fail',
        expect.stringMatching(/^✕ FAIL\s+fails: simulator agreement; 45 of 45 corners pass/),
      ]);
      const parts = await page.$$eval('header #verdict-parts li', (lis) =>
        lis.map((li) => [li.getAttribute('data-part'), li.getAttribute('data-verdict'), (li as HTMLElement).innerText]),
      );
      expect(parts[0]!.slice(0, 2)).toEqual(['corner checks', 'pass']);
      expect(parts[2]).toEqual([
        'simulator agreement',
        'fail',
        'simulator agreement: ✕ FAIL: 1 quantity beyond 10.0 % (first: dead p1->p2 at ff/1.98V/-40C); 1 break-before-make pair disagrees (first: s_gnd/s_vdd break-before-make + 100 ps at ff/1.98V/-40C); ngspice-test gives dead p1->p2 440 ps at ff/1.98V/-40C, below the 500 ps minimum',
      ]);
      const boxes = await page.$$eval('figure svg .title-block .verdict-detail', (ts) => ts.map((t) => t.textContent));
      expect(boxes.slice(0, 3)).toEqual(['simulator agreement fails', 'simulator agreement fails', 'simulator agreement fails']);
      const footer = await page.$$eval('#provenance li', (lis) => lis.map((li) => (li as HTMLElement).innerText));
      expect(footer).toEqual([
        'phasegap 0.0.0-test, 2026-01-01T00:00:00.000Z',
        'command: phasegap report doubler.yaml --confirm worst',
        'delay model: analytic, error band not measured',
        'simulator: ngspice-test',
      ]);
      expect(await page.$$eval('figure svg metadata', (ms) => ms.map((m) => m.getAttribute('data-verdict')))).toEqual([
        'fail',
        'fail',
        'fail',
      ]);
    } finally {
      await page.close();
    }
  });

  it("lays out the circuit against the simulator, marks the figure over its tolerance and fails the page's verdict on it", async () => {
    // Made-up comparison (ngspice is not run): doubler-pump's figures at tt with the simulator's ripple 12.7 % above the model's.
    const resolved = resolveYaml(readFileSync(design('doubler-pump'), 'utf8'));
    const fig = (
      figure: 'output' | 'ripple' | 'efficiency' | 'lost charge',
      unit: 'V' | 'C' | '',
      model: number,
      simulator: number,
      difference: number | null,
      tolerance: number | null,
    ) => ({
      figure,
      unit,
      model,
      simulator,
      difference,
      tolerance,
      pass: tolerance === null || Math.abs(difference!) <= tolerance,
    });
    const figures = [
      fig('output', 'V', 3.335, 3.333, 0.001, 0.02),
      fig('ripple', 'V', 0.0199, 0.0228, -0.127, 0.1),
      fig('efficiency', '', 0.447, 0.419, 0.067, 0.1),
      fig('lost charge', 'C', 0, 269e-15, null, null),
    ];
    const power = { input: 223e-6, generator: 150e-6, output: 167e-6 };
    const confirm = {
      simulator: 'ngspice-test',
      tolerance: 0.1,
      comparisons: [
        {
          corner: 'tt/1.8V/27C',
          errors: [],
          pass: false,
          ron: [],
          breakBeforeMake: [],
          quantities: [
            { quantity: 'dead p1->p2', kind: 'dead' as const, model: 1.72e-9, simulator: 1.81e-9, relativeError: -0.049, pass: true },
          ],
          circuit: { periods: 75, drift: 1e-6, settled: true, pass: false, figures, power: { model: power, simulator: power } },
        },
      ],
    };
    const model = buildReportModel(resolved, evaluateAll(resolved), {
      processSource: 'fixtures',
      fmax: null,
      fmaxNote: 'skipped',
      confirm,
    });
    const file = join(tempDir(), 'circuit-confirm.html');
    writeFileSync(file, renderHtmlReport(model));
    const page = await browser.newPage({ viewport: { width: 1320, height: 1000 } });
    try {
      await page.goto(pathToFileURL(file).href, { waitUntil: 'load' });
      expect(await page.$eval('header .verdict', (v) => [v.getAttribute('data-verdict'), (v as HTMLElement).innerText])).toEqual([
        'fail',
        expect.stringMatching(/^✕ FAIL\s+fails: simulator agreement;/),
      ]);
      expect(await page.$eval('header li[data-part="simulator agreement"]', (li) => (li as HTMLElement).innerText)).toBe(
        'simulator agreement: ✕ FAIL: 1 circuit figure beyond tolerance (first: ripple at tt/1.8V/27C)',
      );
      const table = await page.$eval('#confirm table.circuit-confirm', (t) => {
        const r = t.getBoundingClientRect();
        const heading = t.closest('.table-wrap')!.previousElementSibling!.previousElementSibling as HTMLElement;
        return {
          heading: heading.innerText,
          head: [...t.querySelectorAll('th')].map((x) => (x as HTMLElement).innerText),
          failing: [...t.querySelectorAll('tr.fail')].map((x) => x.getAttribute('data-figure')),
          verdictColour: getComputedStyle(t.querySelector('tr.fail td.verdict-cell')!).color,
          passColour: getComputedStyle(t.querySelector('tr:not(.fail) td.verdict-cell')!).color,
          w: r.width,
          h: r.height,
          fits: r.right <= document.documentElement.clientWidth + 0.5,
        };
      });
      expect(table.heading).toBe('Circuit against ngspice-test at tt/1.8V/27C');
      expect(table.head).toEqual(['figure', 'model', 'ngspice-test', 'difference', 'tolerance', 'verdict']);
      expect(table.failing).toEqual(['ripple']);
      expect(table.verdictColour).not.toBe(table.passColour);
      expect(table.w > 0 && table.h > 0 && table.fits).toBe(true);
      if (SCREENSHOTS) {
        mkdirSync(SCREENSHOTS, { recursive: true });
        writeFileSync(join(SCREENSHOTS, 'report-circuit-confirm.png'), await page.locator('#confirm').screenshot());
      }
    } finally {
      await page.close();
    }
  });

  it('doubler-pump: lays out the circuit rows, the circuit table and the frequency chart with no label overlap, and prints them', async () => {
    const { page, problems } = await openReport('doubler-pump', ['--no-fmax', '--no-tune']);
    try {
      expect(problems).toEqual([]);
      const figures = await page.$$eval('figure', (fs) =>
        fs.map((f) => {
          const r = f.querySelector('svg')!.getBoundingClientRect();
          return { id: f.id, w: r.width, h: r.height };
        }),
      );
      expect(figures.map((f) => f.id)).toEqual(['figure-worst', 'figure-all', 'figure-margins', 'figure-circuit-sweep']);
      for (const f of figures) expect(f.w > 0 && f.h > 0, f.id).toBe(true);
      // Three circuit rows (out, top, bottom) in each timing diagram.
      expect(await page.$$eval('#figure-worst .circuit-row', (rs) => rs.map((r) => r.getAttribute('data-node')))).toEqual([
        'out',
        'top',
        'bottom',
      ]);
      const overlaps = await page.$$eval('figure svg', (svgs) =>
        svgs.flatMap((svg) => {
          const boxes = [...svg.querySelectorAll('text')]
            .filter((t) => (t.textContent ?? '').trim() !== '')
            .map((t) => ({ text: t.textContent ?? '', r: t.getBoundingClientRect() }))
            .filter((b) => b.r.width > 0 && b.r.height > 0);
          const found: string[] = [];
          for (let i = 0; i < boxes.length; i++) {
            for (let j = i + 1; j < boxes.length; j++) {
              const a = boxes[i]!.r;
              const b = boxes[j]!.r;
              if (
                Math.min(a.right, b.right) - Math.max(a.left, b.left) > 0.5 &&
                Math.min(a.bottom, b.bottom) - Math.max(a.top, b.top) > 0.5
              )
                found.push(`${boxes[i]!.text} / ${boxes[j]!.text}`);
            }
          }
          return found;
        }),
      );
      expect(overlaps).toEqual([]);
      const table = await page.$eval('#circuit table', (t) => {
        const r = t.getBoundingClientRect();
        return { rows: t.querySelectorAll('tbody tr').length, w: r.width, fits: r.right <= document.documentElement.clientWidth + 0.5 };
      });
      expect(table.rows).toBe(45);
      expect(table.w > 0 && table.fits).toBe(true);
      await page.emulateMedia({ media: 'print' });
      expect(await page.$eval('#circuit', (s) => getComputedStyle(s).breakBefore)).toBe('page');
      const printed = await page.$eval('#circuit', (s) => ({
        table: s.querySelector('table')!.getBoundingClientRect().width,
        chart: s.querySelector('svg')!.getBoundingClientRect().width,
      }));
      expect(printed.table).toBeGreaterThan(0);
      expect(printed.chart).toBeGreaterThan(0);
      const pdf = (await page.pdf({ preferCSSPageSize: true, printBackground: true })).toString('latin1');
      expect(pdf.slice(0, 4)).toBe('%PDF');
      if (SCREENSHOTS) {
        mkdirSync(SCREENSHOTS, { recursive: true });
        await page.emulateMedia({ media: 'screen' });
        writeFileSync(join(SCREENSHOTS, 'report-doubler-pump.png'), await page.screenshot({ fullPage: true }));
      }
    } finally {
      await page.close();
    }
  });

  it('prints as an A4 portrait document: a page per section, every drawing laid out', async () => {
    const { page, problems } = await openReport('doubler', ['--no-fmax']);
    try {
      await page.emulateMedia({ media: 'print' });
      const background = await page.$eval('body', (b) => getComputedStyle(b).backgroundColor);
      expect(background).toBe('rgb(255, 255, 255)');
      const breaks = await page.$$eval('main > section', (ss) => ss.map((s) => [s.id, getComputedStyle(s).breakBefore]));
      expect(breaks).toEqual([
        ['cautions', 'auto'],
        ['summary', 'auto'],
        ['worst-corner', 'page'],
        ['all-corners', 'page'],
        ['margins', 'page'],
        ['tune', 'page'],
        ['corners', 'page'],
        ['switches', 'page'],
        ['nodes', 'page'],
        ['process', 'page'],
      ]);
      const widths = await page.$$eval('figure svg', (svgs) => svgs.map((s) => s.getBoundingClientRect().width));
      expect(widths.every((w) => w > 0)).toBe(true);
      const pdf = await page.pdf({ preferCSSPageSize: true, printBackground: true });
      const text = pdf.toString('latin1');
      expect(text.slice(0, 4)).toBe('%PDF');
      // A4 is 210 x 297 mm = 595.3 x 841.9 pt (ISO 216); chromium writes the box in points.
      const box = /\/MediaBox\s*\[\s*0 0 ([\d.]+) ([\d.]+)\s*\]/.exec(text)!;
      expect(Math.abs(Number(box[1]) - 595.3)).toBeLessThan(1);
      expect(Math.abs(Number(box[2]) - 841.9)).toBeLessThan(1);
      // 10 pages measured with Debian's chromium (the page before the print stylesheet: 16 landscape pages).
      const pages = text.match(/\/Type\s*\/Page[^s]/g)!.length;
      expect(pages).toBeGreaterThanOrEqual(9);
      expect(pages).toBeLessThanOrEqual(11);
      expect(problems).toEqual([]);
    } finally {
      await page.close();
    }
  });
});
