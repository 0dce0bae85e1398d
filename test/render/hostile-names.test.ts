/**
 * Names in the review page's Markdown and in every SVG drawing are data. SVGs are parsed with
 * xmllint (Debian package libxml2-utils), which rejects any character XML 1.0 forbids.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { cliAsync, tempDir } from '../helpers.js';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { buildReportModel } from '../../src/render/report-model.js';
import { renderMarkdownReport } from '../../src/render/markdown/report.js';
import { xmlDocument, xmlText } from '../../src/render/svg/xml-text.js';
import { hostileName, hostileResolved, PLAIN_YAML } from '../schema/hostile.js';
import { requireTool } from '../tools.js';

function xmllint(file: string): { status: number | null; stderr: string } {
  const run = spawnSync('xmllint', ['--noout', file], { encoding: 'utf8' });
  return { status: run.status, stderr: run.stderr };
}

const IMAGES = { worst: 'r-worst.svg', all: 'r-all.svg', margins: 'r-margins.svg' };

describe('the review page of a design with hostile names (validation bypassed)', () => {
  const resolved = hostileResolved(join(tempDir(), 'ran'));
  const model = buildReportModel(resolved, evaluateAll(resolved), { processSource: 'card `x`\n<b>.yaml', fmax: null, fmaxNote: 'skipped' });

  it('writes Markdown with every tag as entities, no heading from a name, and the drawings linked', () => {
    const md = renderMarkdownReport(model, IMAGES);
    // A code span shows its text verbatim (CommonMark 6.1), so the process path may keep its <b>.
    expect(md).toContain('Source: `` card `x` <b>.yaml ``.');
    expect(md.replace(/(`+) .*? \1/g, '')).not.toMatch(/<\/?[a-z!]/i);
    expect(md).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(md).not.toMatch(/[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069\u2028\u2029]/);
    expect(
      md
        .split('\n')
        .filter((l) => /^#/.test(l))
        .map((l) => l.replace(/ .*/, '')),
    ).toEqual(['#', '##', '##', '##', '##', '##', '##']);
    expect(md).toContain('![All corners overlaid](r-all.svg)');
    expect(md).toMatch(/^# design \.control shell touch /m);
  });

  it.each(['worst', 'all', 'margins'] as const)('draws the %s SVG as well-formed XML (xmllint)', (which) => {
    const file = join(tempDir(), `${which}.svg`);
    writeFileSync(file, model.svg[which]);
    expect(xmllint(file)).toEqual({ status: 0, stderr: '' });
    expect(model.svg[which]).toContain('&lt;script&gt;');
  });
});

describe('phasegap draw and report with names that are valid but full of markup', () => {
  requireTool('xmllint', 'libxml2-utils');
  const yaml = PLAIN_YAML.replace(
    'name: plain',
    `name: ${JSON.stringify('<script>alert(1)</script> & ]]> "q" \'s\' `x` *y* [z](javascript:1)')}`,
  )
    .replace('name: g_inv,', 'name: "<b>inv</b>",')
    .replace('name: handover,', 'name: "a|b <i>c</i>",');

  it('draws an SVG that xmllint reads, with the name as text', async () => {
    const dir = tempDir();
    const file = join(dir, 'd.yaml');
    writeFileSync(file, yaml);
    const out = join(dir, 'd.svg');
    const drawn = await cliAsync('draw', file, '-o', out);
    expect(drawn.stderr).toBe('');
    expect([0, 1]).toContain(drawn.code);
    expect(xmllint(out)).toEqual({ status: 0, stderr: '' });
    expect(readFileSync(out, 'utf8')).toContain('&lt;script&gt;alert(1)&lt;/script&gt; &amp; ]]&gt;');
  });

  it('writes a Markdown report with the names escaped', async () => {
    const dir = tempDir();
    const file = join(dir, 'd.yaml');
    writeFileSync(file, yaml);
    const out = join(dir, 'my review (1).md');
    const written = await cliAsync('report', file, '--format', 'md', '--no-fmax', '--no-tune', '-o', out);
    expect(written.stderr).toBe('');
    expect([0, 1]).toContain(written.code);
    const md = readFileSync(out, 'utf8');
    expect(md.split('\n')[0]).toBe(
      '# &lt;script&gt;alert(1)&lt;/script&gt; &amp; \\]\\]&gt; "q" \'s\' \\`x\\` \\*y\\* \\[z\\](javascript:1)',
    );
    expect(md).toContain('| a\\|b &lt;i&gt;c&lt;/i&gt; |');
    expect(md).toContain('![All corners overlaid](my%20review%20%281%29-all.svg)');
    expect(md).not.toMatch(/<\/?[a-z]/i);
    for (const svg of ['my review (1)-all.svg', 'my review (1)-worst.svg', 'my review (1)-margins.svg']) {
      expect(xmllint(join(dir, svg)), svg).toEqual({ status: 0, stderr: '' });
    }
  });
});

describe('xmlText and xmlDocument', () => {
  const NOT_XML = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]|[\ud800-\udfff]/;

  it.each(['a\u0000b', 'a\u000bb\u000c', '\ufffe\uffff', 'x\ud800', '\udc00x', hostileName('/tmp/x', 'all')])(
    'leaves no character XML 1.0 forbids in %j',
    (text) => {
      expect(xmlDocument(text)).not.toMatch(NOT_XML);
      expect(xmlText(text)).not.toMatch(NOT_XML);
      expect(xmlText(text)).not.toMatch(/[\n\r\t\u2028\u2029\u0085\u202e\u2066]/);
    },
  );

  it('keeps characters outside the BMP and ordinary text', () => {
    expect(xmlDocument('φ1 \ud83d\ude00 <a>')).toBe('φ1 \ud83d\ude00 <a>');
    expect(xmlText('a\nb')).toBe('a b');
  });
});
