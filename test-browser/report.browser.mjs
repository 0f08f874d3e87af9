/**
 * npm run test:browser: opens the HTML job report in headless Chromium (Debian's, driven by
 * playwright-core) and checks the page's text and the chart's SVG against the model's numbers.
 * Then prints it to PDF at A4 and Letter and reads the pages back with pdftotext: every page
 * carries the job and its number, and no table is split across two pages.
 * Needs /usr/bin/chromium and pdftotext (Debian packages "chromium", "poppler-utils"); npm test
 * does not run this.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { chromium } from 'playwright-core';

const root = fileURLToPath(new URL('..', import.meta.url));
const executablePath = process.env.CHROMIUM ?? '/usr/bin/chromium';
if (!existsSync(executablePath)) {
  console.error(`test:browser needs Chromium at ${executablePath} (Debian package "chromium").`);
  process.exit(1);
}

const out = mkdtempSync(join(tmpdir(), 'dctriage-browser-'));
const report = join(out, 'report.html');
// The recorded job, with typed text that a Markdown renderer would turn into links.
const job = join(out, 'job.json');
const recorded = JSON.parse(readFileSync(join(root, 'cases', '2026-10-14-press-feed-field-weak.json'), 'utf8'));
// Without its worked checks, so the report lists checks still to do with the isolation before them.
delete recorded.checks;
recorded.outcome.notes += ' Manual: http://example.com/manual, www.example.org and [the drawing](http://example.com/d.pdf).';
writeFileSync(job, JSON.stringify(recorded));
execFileSync(process.execPath, [join(root, 'dist', 'cli.mjs'), 'diagnose', job, '--report', report], { stdio: ['ignore', 'ignore', 'inherit'] });
const expected = JSON.parse(execFileSync(process.execPath, [join(root, 'dist', 'cli.mjs'), 'expect', job, '--json'], { encoding: 'utf8' }));

const profile = mkdtempSync(join(tmpdir(), 'dctriage-chromium-'));
// A fresh profile each run; Playwright takes the user-data dir as a parameter, not a flag.
const browser = await chromium.launchPersistentContext(profile, {
  executablePath,
  headless: true,
  args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-quic'],
});
let failures = 0;
let passed = 0;
const check = (what, ok, detail = '') => {
  if (ok) passed++;
  else failures++;
  console.log(`${ok ? 'ok  ' : 'FAIL'} ${what}${ok || !detail ? '' : `: ${detail}`}`);
};
try {
  const page = browser.pages()[0] ?? (await browser.newPage());
  await page.goto(pathToFileURL(report).href);
  const text = await page.locator('body').innerText();
  check('the page has the report title', /Job report: PF-3 feed roll/.test(text));
  check('dangers come before the causes', text.indexOf('Dangers found') >= 0 && text.indexOf('Dangers found') < text.indexOf('Likely causes'));
  check('the leading cause is named by its title', text.includes('Field weak'));
  check('the readings table shows measured and expected speed', /speed\s+2010 rpm\s+1586 rpm\s+127 %/.test(text), text.match(/speed\s+[^\n]*/)?.[0]);
  const svg = page.locator('figure.chart > svg');
  check('the chart is drawn inline as SVG', (await svg.count()) === 1);
  const healthy = await page.locator('polyline[data-series="healthy"]').getAttribute('points');
  const vertices = (healthy ?? '').trim().split(/\s+/).filter(Boolean);
  check('the healthy curve has a vertex per computed point', vertices.length >= 20, `${vertices.length} vertices`);
  const measured = page.locator('circle[data-series="measured"]');
  check('the measured point is marked once', (await measured.count()) === 1);
  const box = await svg.boundingBox();
  check('the chart is laid out with a size', !!box && box.width > 200 && box.height > 100, JSON.stringify(box));
  const [cy, ys] = [Number(await measured.getAttribute('cy')), vertices.map((v) => Number(v.split(',')[1]))];
  check('the measured point sits above the healthy curve (faster than healthy)', cy < Math.min(...ys), `cy ${cy}, curve y ${Math.min(...ys)}–${Math.max(...ys)}`);
  const desc = await page.locator('figure.chart > svg > desc').textContent();
  check('the chart describes itself in words', (desc ?? '').includes(`${Math.round(expected.quantities.speed.value)} rpm`), desc ?? '');
  check('the HTML carries no script', !/<script/i.test(readFileSync(report, 'utf8')));
  check('typed text makes no live link', (await page.locator('a').count()) === 0 && text.includes('http://example.com/manual'), `${await page.locator('a').count()} links`);

  // Numbering: the checks count 1, 2, 3… and the isolation steps their own 1…n, apart.
  const checkHeadings = await page.locator('h3').allInnerTexts();
  const checks = checkHeadings.filter((h) => h.startsWith('Check '));
  check('the checks are numbered 1, 2, 3… whatever comes between them', checks.length >= 2 && checks.every((h, k) => h.startsWith(`Check ${k + 1}: `)), checks.join(' | '));
  const isolationList = page.locator('h3:has-text("Isolation, before check") ~ ol').first();
  const steps = await isolationList.locator('> li').count();
  const start = (await isolationList.getAttribute('start')) ?? '1';
  check('the isolation steps are numbered from 1 in a list of their own', steps >= 5 && start === '1', `${steps} steps from ${start}`);
  const reading = page.locator('td', { hasText: /^2010 rpm$/ });
  check('numbers in the readings table are right-aligned', (await reading.evaluate((el) => getComputedStyle(el).textAlign)) === 'right');

  // Print: A4 and Letter, the job and the page number on every page, no table split.
  for (const format of ['A4', 'Letter']) {
    const pdf = join(out, `report-${format}.pdf`);
    await page.pdf({ path: pdf, format, displayHeaderFooter: false, preferCSSPageSize: false });
    const pages = execFileSync('pdftotext', ['-layout', pdf, '-'], { encoding: 'utf8' }).split('\f').filter((p) => p.trim());
    check(`${format}: the report prints on 2 to 8 pages`, pages.length >= 2 && pages.length <= 8, `${pages.length} pages`);
    check(`${format}: every page carries the work order, the asset and its number`, pages.every((p, k) => p.includes('WO-70311') && p.includes('PF-3 feed roll') && p.includes(`Page ${k + 1} of ${pages.length}`)), pages.map((p) => p.slice(0, 80)).join(' / '));
    const onPage = (needle) => pages.findIndex((p) => p.includes(needle));
    const tables = [['Nameplate', 'insulation class'], ['Reading', 'with measured field'], ['Reading after the repair', '1595 rpm'], ['Signature', 'Returned to service by']];
    const split = tables.filter(([first, last]) => onPage(first) < 0 || onPage(first) !== onPage(last));
    check(`${format}: no table is split across pages`, split.length === 0, JSON.stringify(split.map(([f, l]) => [f, onPage(f), l, onPage(l)])));
    const signatures = onPage('Returned to service by');
    check(`${format}: the sign-off heading is on the page of its table`, signatures >= 0 && onPage('Sign-off') === signatures);
  }
} finally {
  await browser.close();
}
console.log(`\n${passed} passed, ${failures} failed`);
process.exit(failures ? 1 : 0);
