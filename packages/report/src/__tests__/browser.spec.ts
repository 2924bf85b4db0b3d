/**
 * The HTML report in a real browser: Debian's chromium, driven by playwright-core. Checks that
 * every plot rendered (non-empty bounding box), that the page logged no console error, raised no
 * page error and requested nothing but its own file:// URL and inline data: URIs, and saves a
 * screenshot to <repo>/.artifacts/report-screenshot.png (kept by CI as an artifact).
 * Chromium is required: without it this test fails (it does not skip). Install it with
 * `apt-get install -y chromium`; CHROMIUM_PATH overrides /usr/bin/chromium.
 */
import { existsSync, mkdirSync, mkdtempSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { chromium } from 'playwright-core';
import { writeReport } from '../index.ts';
import { makeResults } from './fixtures.ts';

const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
const REPO = resolve(dirname(fileURLToPath(import.meta.url)), '../../../..');
export const SCREENSHOT = join(REPO, '.artifacts', 'report-screenshot.png');

describe('renderReport', () => {
  it('renders every plot in headless Chromium with no console error and no network request', async () => {
    if (!existsSync(CHROMIUM)) {
      throw new Error(`Chromium not found at ${CHROMIUM}: install Debian's chromium package (apt-get install -y chromium) or set CHROMIUM_PATH`);
    }
    const dir = mkdtempSync(join(tmpdir(), 'skein-report-browser-'));
    const htmlPath = writeReport(makeResults(), join(dir, 'report.html'));
    const browser = await chromium.launch({ executablePath: CHROMIUM, headless: true, args: ['--no-sandbox', '--disable-gpu'] });
    try {
      const page = await browser.newPage({ viewport: { width: 1024, height: 900 } });
      const consoleErrors: string[] = [];
      const requests: string[] = [];
      page.on('console', (m) => { if (m.type() === 'error' || m.type() === 'warning') consoleErrors.push(`${m.type()}: ${m.text()}`); });
      page.on('pageerror', (e) => consoleErrors.push(`pageerror: ${e.message}`));
      page.on('request', (r) => requests.push(r.url()));
      const url = pathToFileURL(htmlPath).href;
      await page.goto(url, { waitUntil: 'load' });
      const plots = page.locator('svg.skein-plot');
      expect(await plots.count()).toBe(4);
      const all = page.locator('svg');
      const n = await all.count();
      expect(n).toBeGreaterThan(4);
      for (let i = 0; i < n; i++) {
        const box = await all.nth(i).boundingBox();
        expect(box, `svg #${i} has a layout box`).not.toBeNull();
        expect(box!.width, `svg #${i} width`).toBeGreaterThan(10);
        expect(box!.height, `svg #${i} height`).toBeGreaterThan(10);
      }
      // The space-time raster decoded (an <image> with a natural size), not a broken image.
      const raster = await page.evaluate(() => {
        const img = document.querySelector('g.skein-space-time image') as SVGImageElement | null;
        const b = img?.getBoundingClientRect();
        return b ? { w: b.width, h: b.height } : null;
      });
      expect(raster && raster.w > 100 && raster.h > 100).toBe(true);
      expect(await page.locator('footer#safety').innerText()).toContain('IEC 62305');
      expect(consoleErrors).toEqual([]);
      expect(requests.filter((u) => u !== url && !u.startsWith('data:'))).toEqual([]);
      mkdirSync(dirname(SCREENSHOT), { recursive: true });
      await page.screenshot({ path: SCREENSHOT, fullPage: true });
      expect(statSync(SCREENSHOT).size).toBeGreaterThan(20_000);
    } finally {
      await browser.close();
    }
  });
});
