/**
 * Screenshots of the built site for a person to look at:
 *   npx tsx scripts/screenshot-pages.mts "<path>=<name>[=<css selector>]" …
 * serves dist/ on 127.0.0.1, opens each path in Debian Chromium and writes
 * /tmp/<name>.png (the whole page, or the last element matching the selector).
 */
import { chromium } from 'playwright-core';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { serveStatic } from '../src/cli/static-server.ts';
const server = await serveStatic('dist', 0);
const ctx = await chromium.launchPersistentContext(mkdtempSync(join(tmpdir(), 'chr-')), { executablePath: '/usr/bin/chromium', headless: true, args: ['--headless','--no-sandbox','--disable-gpu','--disable-quic','--no-first-run','--disable-background-networking','--disable-component-update','--disable-sync'] });
const page = await ctx.newPage();
await page.setViewportSize({ width: 1280, height: 900 });
for (const [path, name, selector] of process.argv.slice(2).map((a) => a.split('='))) {
  await page.goto(server.url + path);
  if (selector) await page.locator(selector).last().screenshot({ path: `/tmp/${name}.png` });
  else await page.screenshot({ path: `/tmp/${name}.png`, fullPage: true });
}
await ctx.close(); await server.close();
