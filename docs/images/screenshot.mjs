/**
 * Screenshots of a qualification report (check --report) for the documentation, in headless Chromium
 * through playwright-core: the header (verdict, caution, what was tested) and the first solver's
 * evidence table. Nothing is fetched: the report is self-contained.
 *
 *   node docs/images/screenshot.mjs REPORT.html OUTDIR [CHROMIUM]
 *
 * writes OUTDIR/record-header.png and OUTDIR/record-evidence.png. CHROMIUM defaults to
 * /usr/bin/chromium (Debian's package).
 */
import { resolve, join } from 'node:path';
import { chromium } from 'playwright-core';

const [html, outDir, executablePath = '/usr/bin/chromium'] = process.argv.slice(2);
if (!html || !outDir) {
  process.stderr.write('usage: node docs/images/screenshot.mjs REPORT.html OUTDIR [CHROMIUM]\n');
  process.exit(2);
}
const browser = await chromium.launch({ executablePath, args: ['--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking'] });
try {
  const page = await browser.newPage({ viewport: { width: 1150, height: 900 }, deviceScaleFactor: 1 });
  await page.goto(`file://${resolve(html)}`);
  // The header: from the top of the page to the end of "What was tested".
  const identity = await page.locator('#identity').boundingBox();
  if (!identity) throw new Error(`${html}: no section #identity (not a qualification report?)`);
  await page.screenshot({ path: join(outDir, 'record-header.png'), clip: { x: 0, y: 0, width: 1150, height: Math.ceil(identity.y + identity.height + 16) }, fullPage: true });
  await page.locator('#evidence section.evidence').first().screenshot({ path: join(outDir, 'record-evidence.png') });
} finally {
  await browser.close();
}
