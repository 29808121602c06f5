/**
 * Screenshots of the built site for a person to look at:
 *   npx tsx scripts/screenshot-pages.mts [--widths 1366,390] [--out DIR] [--slice PX] [--dist DIR] "<path>=<name>[=<css selector>]" …
 * serves dist/ (or DIR) on 127.0.0.1, opens each path in Debian Chromium at each width and
 * writes DIR/<name>-<width>.png (default DIR test-results/screenshots; the whole
 * page, or the last element matching the selector). Prints, per page and width,
 * any horizontal overflow and console errors, so they are not missed. --slice
 * also writes long pages in numbered slices of PX pixels for a closer look.
 */
import { chromium } from 'playwright-core';
import { mkdirSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { serveStatic } from '../src/cli/static-server.ts';

const args = process.argv.slice(2);
let widths = [1366, 390];
let out = join('test-results', 'screenshots');
let slice = 0;
let root = 'dist';
const targets: string[] = [];
for (let i = 0; i < args.length; i++) {
  if (args[i] === '--widths') widths = args[++i].split(',').map(Number);
  else if (args[i] === '--out') out = args[++i];
  else if (args[i] === '--slice') slice = Number(args[++i]);
  else if (args[i] === '--dist') root = args[++i];
  else targets.push(args[i]);
}
mkdirSync(out, { recursive: true });
const server = await serveStatic(root, 0);
const ctx = await chromium.launchPersistentContext(mkdtempSync(join(tmpdir(), 'chr-')), { executablePath: '/usr/bin/chromium', headless: true, args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'] });
const page = await ctx.newPage();
const errors: string[] = [];
page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
page.on('pageerror', (e) => errors.push(String(e)));
for (const width of widths) {
  await page.setViewportSize({ width, height: width < 600 ? 844 : 900 });
  // The path may hold '=' (a query string): split before the kebab-case name.
  for (const [path, name, selector] of targets.map((a) => a.split(/=(?=[a-z0-9-]+(?:=|$))/))) {
    errors.length = 0;
    await page.goto(server.url.replace(/\/$/, '') + path, { waitUntil: 'networkidle' });
    const file = join(out, `${name}-${width}.png`);
    if (selector) await page.locator(selector).last().screenshot({ path: file });
    else await page.screenshot({ path: file, fullPage: true });
    if (slice > 0 && !selector) {
      // Long pages also in slices of `slice` pixels, to look at in detail.
      const height = await page.evaluate(() => document.documentElement.scrollHeight);
      for (let y = 0, n = 1; y < height; y += slice, n++) {
        await page.screenshot({ path: join(out, `${name}-${width}-${n}.png`), fullPage: true, clip: { x: 0, y, width, height: Math.min(slice, height - y) } });
      }
    }
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    console.log(`${file}${overflow > 0 ? `  OVERFLOW ${overflow}px` : ''}${errors.length ? `  CONSOLE ${errors.join(' | ')}` : ''}`);
  }
}
await ctx.close();
await server.close();
