/**
 * The HTML qualification report: self-contained (nothing fetched when opened), the verdict first,
 * the caution, coverage, audit and plots; and, where Debian's Chromium is installed (.ci/run installs
 * it), it renders in headless Chromium without console errors.
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { crossbound, tempFile } from './cli.js';

// Overridable to test the missing-Chromium paths: CROSSBOUND_TEST_CHROMIUM=/nonexistent.
const CHROMIUM = process.env.CROSSBOUND_TEST_CHROMIUM ?? '/usr/bin/chromium';
const dir = dirname(tempFile('x', ''));
const report = join(dir, 'report.html');

describe('check --report', () => {
  it('writes a self-contained report: verdict first, caution, coverage, audit, three inline SVG plots', () => {
    const r = crossbound(['check', 'corpus/models/ferry-crossing.yaml', 'corpus/models/kettle-scale.yaml', '--report', report]);
    expect(r.code).toBe(0);
    const html = readFileSync(report, 'utf8');
    const order = ['class="verdict PASS"', 'evidence, not proof', '<h2>Corpus coverage', '<h2>Bound audit', '<h2>Disagreements', '<h2>Plots'].map((s) => html.indexOf(s));
    expect(order.every((i) => i > 0)).toBe(true);
    expect([...order].sort((a, b) => a - b)).toEqual(order);
    expect(html.match(/<svg/g)?.length).toBe(3);
    // Nothing to fetch: no scripts, stylesheets, images or frames from anywhere.
    expect(html).not.toMatch(/<(script|link|img|iframe)\b/i);
    expect(html).not.toMatch(/(src|href)\s*=\s*["']?https?:/i);
    expect(html).toMatch(/Fitted slopes/);
  });

  const haveChromium = existsSync(CHROMIUM);
  // In CI (CI=true, as .ci/run sets it) the rendering test is required: a missing Chromium fails it.
  // Elsewhere it is skipped, and the skip is said on stderr and in the test's name.
  const inCi = process.env.CI === 'true' || process.env.CI === '1';
  if (!haveChromium && inCi) {
    it('renders in headless Chromium (required in CI)', () => {
      throw new Error(`CI=${process.env.CI}: ${CHROMIUM} is not installed, so the report rendering cannot be tested (.ci/run installs Debian's chromium)`);
    });
  }
  if (!haveChromium && !inCi) console.warn(`report rendering test skipped: ${CHROMIUM} is not installed (.ci/run installs Debian's chromium; in CI this is a failure)`);
  it.skipIf(!haveChromium)(`renders in headless Chromium without console errors${haveChromium ? '' : ` (SKIPPED: no ${CHROMIUM})`}`, async () => {
    const { chromium } = await import('playwright-core');
    const browser = await chromium.launch({
      executablePath: CHROMIUM,
      args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    });
    try {
      const page = await browser.newPage({ viewport: { width: 1200, height: 900 } });
      const errors: string[] = [];
      const requests: string[] = [];
      page.on('console', (m) => {
        if (m.type() === 'error') errors.push(m.text());
      });
      page.on('pageerror', (e) => errors.push(String(e)));
      page.on('request', (q) => {
        if (!q.url().startsWith('file:')) requests.push(q.url());
      });
      await page.goto(`file://${report}`);
      expect(await page.locator('.verdict').textContent()).toBe('PASS');
      expect(await page.locator('svg').count()).toBe(3);
      const box = await page.locator('svg').first().boundingBox();
      expect(box!.width).toBeGreaterThan(200);
      await page.screenshot({ path: join(dir, 'report.png'), fullPage: true });
      expect(errors).toEqual([]);
      expect(requests).toEqual([]);
    } finally {
      await browser.close();
    }
  });
});
