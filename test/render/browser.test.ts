/**
 * The review page in a real browser: Debian's chromium driven by playwright-core. It must load
 * with no console error and no failed (or any network) request, lay out every drawing at a
 * non-zero size, and keep every text label of every drawing clear of every other.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type Browser } from 'playwright-core';
import { cli, design, ROOT, tempDir, cliAsync } from '../helpers.js';
import { requireTool } from '../tools.js';

requireTool('chromium', 'chromium');
requireTool('ngspice', 'ngspice');

const OUTPUT = join(ROOT, 'test-output');

let browser: Browser;

beforeAll(async () => {
  browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
  });
});

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
  page.on('console', (m) => { if (m.type() === 'error') problems.push(`console: ${m.text()}`); });
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
        const sizes = await page.$$eval('figure svg', (svgs) => svgs.map((s) => {
          const r = s.getBoundingClientRect();
          return { w: r.width, h: r.height };
        }));
        expect(sizes.length).toBe(3);
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
        const tables = await page.$$eval('section table', (ts) => ts.map((t) => {
          const r = t.getBoundingClientRect();
          return { id: t.closest('section')!.id, w: r.width, h: r.height, fits: r.right <= document.documentElement.clientWidth + 0.5 };
        }));
        expect(tables.map((t) => t.id)).toContain('tune');
        if (confirm) expect(tables.filter((t) => t.id === 'confirm').length).toBe(2);
        if (confirm) {
          // ngspice differs from the model beyond 10 % at both corners of too-tight (measured), so the page says so at the top.
          const parts = await page.$$eval('header #verdict-parts li', (lis) => lis.map((li) => `${li.getAttribute('data-part')}: ${li.getAttribute('data-verdict')}`));
          expect(parts).toEqual(['corner checks: fail', 'Monte Carlo yield: not-run', 'simulator agreement: fail']);
          expect(await page.$eval('header .verdict', (v) => v.getAttribute('data-verdict'))).toBe('fail');
        }
        for (const t of tables) expect(t.w > 0 && t.h > 0 && t.fits, t.id).toBe(true);
        mkdirSync(OUTPUT, { recursive: true });
        const png = await page.screenshot({ fullPage: true });
        writeFileSync(join(OUTPUT, `report-${name}.png`), png);
        expect(png.length).toBeGreaterThan(10_000);
      } finally {
        await page.close();
      }
    });
  }

  it('heads a page where Monte Carlo fails with FAIL and shows each part beneath it', async () => {
    // A 964 ps minimum holds at every corner of the demo (least dead time 967 ps) but 14 of 40 dies miss it (seed 1, measured).
    const { page, problems } = await openReport('doubler', ['--no-fmax', '--no-tune', '--mc', '40', '--seed', '1',
      '--set', 'requirements.deadTime.min=964ps', '--set', 'requirements.minYield=0.99']);
    try {
      expect(problems).toEqual([]);
      const verdict = await page.$eval('header .verdict', (v) => ({ verdict: v.getAttribute('data-verdict'), text: (v as HTMLElement).innerText, w: v.getBoundingClientRect().width }));
      expect(verdict.verdict).toBe('fail');
      expect(verdict.text).toMatch(/^✕ FAIL\s+fails: Monte Carlo yield; 45 of 45 corners pass/);
      expect(verdict.w).toBeGreaterThan(0);
      const parts = await page.$$eval('header #verdict-parts li', (lis) => lis.map((li) => {
        const r = li.getBoundingClientRect();
        return { part: li.getAttribute('data-part'), verdict: li.getAttribute('data-verdict'), text: (li as HTMLElement).innerText, shown: r.width > 0 && r.height > 0 };
      }));
      expect(parts.map((p) => [p.part, p.verdict, p.shown])).toEqual([
        ['corner checks', 'pass', true], ['Monte Carlo yield', 'fail', true], ['simulator agreement', 'not-run', true],
      ]);
      expect(parts[1]!.text).toBe('Monte Carlo yield: ✕ FAIL: yield 65.000 % over 40 dies at every corner, below the 99.000 % required');
    } finally {
      await page.close();
    }
  });

  it('prints: the print stylesheet applies and every drawing still has a size', async () => {
    const { page, problems } = await openReport('doubler', ['--no-fmax']);
    try {
      await page.emulateMedia({ media: 'print' });
      const background = await page.$eval('body', (b) => getComputedStyle(b).backgroundColor);
      expect(background).toBe('rgb(255, 255, 255)');
      const widths = await page.$$eval('figure svg', (svgs) => svgs.map((s) => s.getBoundingClientRect().width));
      expect(widths.every((w) => w > 0)).toBe(true);
      const pdf = await page.pdf({ format: 'A4', landscape: true });
      expect(pdf.subarray(0, 4).toString()).toBe('%PDF');
      expect(problems).toEqual([]);
    } finally {
      await page.close();
    }
  });
});
