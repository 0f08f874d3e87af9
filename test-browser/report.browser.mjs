/**
 * npm run test:browser: opens the HTML job report in headless Chromium (Debian's, driven by
 * playwright-core) and checks the page's text and the chart's SVG against the model's numbers.
 * Needs /usr/bin/chromium; npm test does not run this.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
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
const job = join(root, 'cases', '2026-10-14-press-feed-field-weak.json');
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
} finally {
  await browser.close();
}
console.log(`\n${passed} passed, ${failures} failed`);
process.exit(failures ? 1 : 0);
