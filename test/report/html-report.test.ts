/**
 * The HTML report treats what people typed as text: no live link with another scheme than
 * http(s), no remote image, no raw HTML, no forged heading, each value in its own cell or
 * paragraph; and the page itself forbids scripts and remote resources.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { caseSchema } from '../../src/knowledge/case-schema.js';
import { diagnose } from '../../src/engine/diagnose.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { jobReport } from '../../src/report/job-report.js';
import { CONTENT_SECURITY_POLICY, htmlReport } from '../../src/report/html-report.js';
import type { WorkEntry } from '../../src/dialogue/work.js';
import { builtInRules, CASES_DIR } from '../support/rules.js';

const base = builtInRules();
const HOSTILE = {
  link: '[open](javascript:alert(1))',
  data: '[x](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)',
  image: '![t](http://tracker.example/pixel.png)',
  html: '<img src=x onerror=alert(1)><script>alert(2)</script>',
  heading: 'ok\n# Forged heading\n\n## Forged section',
  cell: 'Eve | forged | cells',
  autolink: '<javascript:alert(3)>',
  reference: '[r][1]\n\n[1]: javascript:alert(4)',
};

async function hostileReport(): Promise<string> {
  const raw = JSON.parse(readFileSync(join(CASES_DIR, '2026-10-14-press-feed-field-weak.json'), 'utf8'));
  raw.job = { ...raw.job, fitter: HOSTILE.cell, asset: HOSTILE.heading, isolation: { points: [HOSTILE.image, HOSTILE.reference], provedDeadBy: HOSTILE.autolink } };
  raw.outcome = { ...raw.outcome, notes: `${HOSTILE.link} ${HOSTILE.html} ${HOSTILE.heading}`, fix: HOSTILE.data };
  const job = caseSchema.parse(raw);
  const d = await diagnose(job, base, buildEngine(base));
  const work: WorkEntry[] = [{ check: d.checks[0]!.id, kind: 'done', at: '2026-12-01T10:00:00Z', by: HOSTILE.cell, finding: `${HOSTILE.link}\n${HOSTILE.image}` }];
  const markdown = jobReport({ job, raw, diagnosis: d, safety: base.safety, work, generatedAt: '2026-12-01T21:00:00Z', chartFile: 'report.svg' });
  return htmlReport(markdown, 'Job report', '<svg xmlns="http://www.w3.org/2000/svg"></svg>');
}

describe('the HTML report', () => {
  it('keeps typed links, images, HTML and headings as text', async () => {
    const html = await hostileReport();
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/<img/i);
    expect(html).not.toMatch(/href="(?!https?:)/i);
    expect(html).not.toMatch(/src="http/i);
    expect(html).not.toMatch(/<h[1-6][^>]*>\s*Forged/);
    expect(html.match(/<h1>/g)).toHaveLength(1);
    // The words are all there, as text.
    expect(html).toContain('javascript:alert(1)');
    expect(html).toContain('# Forged heading');
    expect(html).toContain('&lt;script&gt;alert(2)&lt;/script&gt;');
  });

  it('keeps a typed value in its own table cell', async () => {
    const html = await hostileReport();
    expect(html).toContain('<td>Eve | forged | cells</td>');
  });

  it('declares a policy that forbids scripts and remote resources, and still shows the drawing inline', async () => {
    const html = await hostileReport();
    expect(html).toContain(`<meta http-equiv="Content-Security-Policy" content="${CONTENT_SECURITY_POLICY}">`);
    expect(CONTENT_SECURITY_POLICY).toMatch(/default-src 'none'/);
    expect(CONTENT_SECURITY_POLICY).not.toMatch(/script-src|https?:/);
    expect(html).toMatch(/<figure class="chart"><svg/);
  });

  it('renders no link at all (the report links nothing; typed links of any scheme stay words) and no image', async () => {
    const html = await htmlReport('[a](javascript:alert(1)) [b](https://example.org/manual) [c](data:text/html,x) [d](file:///etc/passwd) ![e](https://example.org/e.png) <b>raw</b>', 't');
    expect(html).not.toMatch(/<a\b/);
    expect(html).toContain('b');
    expect(html).not.toMatch(/<img|<b>/);
    expect(html).toContain('&lt;b&gt;raw');
  });
});
