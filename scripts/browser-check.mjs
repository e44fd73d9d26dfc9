// Opens a loopform HTML report in headless Chromium and checks that it renders cleanly:
// no console errors or page errors, at least one SVG with a polyline, the summary table, the sign-off
// block and an index line per loop present, the filter box working; prints to PDF and counts the pages
// (fails above LOOPFORM_MAX_PAGES when that is set).
// Takes a full-page screenshot (the top 16000 px of a longer page). Prints one line; exit code 0 when every check passes, 1 otherwise,
// 2 for bad usage.
//
// usage: node scripts/browser-check.mjs REPORT.html OUT.png
// env:   CHROMIUM (default /usr/bin/chromium)
import { chromium } from 'playwright-core';
import { mkdtempSync, rmSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

const [report, shot] = process.argv.slice(2);
if (!report || !shot) {
  console.error('usage: node scripts/browser-check.mjs REPORT.html OUT.png');
  process.exit(2);
}
if (!existsSync(report)) {
  console.error(`browser-check: ${report}: no such file; write a report first`);
  process.exit(2);
}

const profile = mkdtempSync(join(tmpdir(), 'loopform-chromium-'));
const problems = [];
let context;
try {
  // a persistent context on a fresh directory: playwright passes it as Chromium's --user-data-dir
  context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM || '/usr/bin/chromium',
    headless: true,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    viewport: { width: 1280, height: 900 },
  });
  const page = context.pages()[0] ?? await context.newPage();
  page.on('console', (m) => { if (m.type() === 'error') problems.push(`console error: ${m.text()}`); });
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  // a self-contained report fetches nothing: any request other than the file itself is a problem
  const url = pathToFileURL(resolve(report)).href;
  page.on('request', (r) => { if (r.url() !== url && !r.url().startsWith('data:')) problems.push(`request: ${r.url()}`); });
  await page.goto(url, { waitUntil: 'load' });
  const facts = await page.evaluate(() => ({
    svgs: document.querySelectorAll('svg').length,
    plots: document.querySelectorAll('svg polyline').length,
    summaryTable: document.querySelectorAll('#summary table').length,
    sections: document.querySelectorAll('section.loop').length,
    cautions: document.querySelectorAll('.cautions').length,
    signoff: document.querySelectorAll('#signoff').length,
    indexRows: document.querySelectorAll('#loop-index tbody tr').length,
  }));
  if (facts.signoff < 1) problems.push('no sign-off block (#signoff)');
  if (facts.indexRows < facts.sections) problems.push(`index lists ${facts.indexRows} of ${facts.sections} loops`);
  // the filter box: typing the first tag leaves that loop's line shown
  if (facts.indexRows > 0) {
    const firstTag = await page.evaluate(() => document.querySelector('#loop-index tbody tr th').textContent);
    await page.fill('#filter', firstTag);
    const shown = await page.evaluate(() => [...document.querySelectorAll('#loop-index tbody tr')]
      .filter((tr) => !tr.hidden).length);
    if (shown < 1 || shown > facts.indexRows) problems.push(`filter on '${firstTag}' shows ${shown} lines`);
    await page.fill('#filter', '');
  }
  if (facts.plots < 1) problems.push('no svg with a polyline');
  if (facts.summaryTable < 1) problems.push('no summary table (#summary table)');
  if (facts.cautions < 1) problems.push('no cautions box');
  // a very long report (thousands of loops) is taller than a screenshot can be: take its top
  const height = await page.evaluate(() => document.documentElement.scrollHeight);
  const limit = 16000;
  await page.screenshot(height <= limit ? { path: shot, fullPage: true }
    : { path: shot, fullPage: true, clip: { x: 0, y: 0, width: 1280, height: limit } });
  // the print layout: a PDF as Chromium prints it (A4, the report's own @page rules), its pages counted
  const pdf = await page.pdf({ preferCSSPageSize: true, printBackground: true });
  const pages = (pdf.toString('latin1').match(/\/Type\s*\/Page(?![s\w])/g) || []).length;
  const maxPages = Number(process.env.LOOPFORM_MAX_PAGES || 0);
  if (pages < 1) problems.push('printing gave no pages');
  if (maxPages > 0 && pages > maxPages) problems.push(`prints on ${pages} pages (more than ${maxPages})`);
  const verdict = problems.length === 0 ? 'ok' : 'FAILED';
  console.log(`browser-check ${verdict}: ${report}: ${facts.sections} loop sections, ${facts.svgs} svg, `
    + `${facts.plots} polylines, ${facts.summaryTable} summary tables, ${facts.indexRows} index lines; `
    + `prints on ${pages} A4 pages; screenshot ${shot}`
    + (problems.length ? `; ${problems.join('; ')}` : ''));
  process.exitCode = problems.length === 0 ? 0 : 1;
} catch (e) {
  console.log(`browser-check FAILED: ${report}: ${e.message.split('\n')[0]}`);
  process.exitCode = 1;
} finally {
  if (context) await context.close();
  rmSync(profile, { recursive: true, force: true });
}
