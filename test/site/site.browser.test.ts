// End-to-end: verify a small catalogue, build the site from its records, serve it
// and read it in a real browser (Debian Chromium through playwright-core).
// Checks what a reader relies on: every model listed with its status, the filters,
// the claims table with verdicts and certificates, figures, downloads that match
// the records, and untrusted Markdown that cannot run script.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { verifyCatalogue } from '../../src/catalogue/verify/catalogue.ts';
import { writeResults } from '../../src/catalogue/records/write.ts';
import { serveStatic, type RunningServer } from '../../src/cli/static-server.ts';

const CHROMIUM = '/usr/bin/chromium';
const hasBrowser = existsSync(CHROMIUM);

describe.skipIf(!hasBrowser)('catalogue site in a browser', () => {
  const work = mkdtempSync(join(tmpdir(), 'strobe-site-'));
  const results = join(work, 'results');
  const dist = join(work, 'dist');
  let server: RunningServer;
  let context: BrowserContext;
  let page: Page;
  const violations: string[] = [];

  beforeAll(async () => {
    const report = await verifyCatalogue(['test/fixtures/site'], { workers: 0, cache: false });
    writeResults(results, report.records, report.summary, report.timings);
    const build = spawnSync(process.execPath, ['node_modules/astro/astro.js', 'build', '--silent', '--outDir', dist], {
      env: { ...process.env, STROBE_RESULTS: results, STROBE_INVENTORY: JSON.stringify(['test/fixtures/site']) },
      encoding: 'utf8',
    });
    if (build.status !== 0) throw new Error(`site build failed:\n${build.stderr}\n${build.stdout}`);
    server = await serveStatic(dist, 0);
    context = await chromium.launchPersistentContext(mkdtempSync(join(tmpdir(), 'strobe-chromium-')), {
      executablePath: CHROMIUM,
      headless: true,
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    });
    page = await context.newPage();
    // Anything the Content-Security-Policy of the server blocks shows up here (and as a console error).
    page.on('console', (message) => {
      if (message.type() === 'error') violations.push(message.text());
    });
    page.on('pageerror', (error) => violations.push(error.message));
  }, 600_000);

  afterAll(async () => {
    await context?.close();
    await server?.close();
  });

  it('lists every model with the status the records give it', async () => {
    const summary = JSON.parse(readFileSync(join(results, 'catalogue.json'), 'utf8'));
    await page.goto(server.url);
    const rows = page.locator('table.inventory tbody tr');
    await expect.poll(() => rows.count()).toBe(summary.models.length);
    for (const model of summary.models) {
      const status = await page.locator(`tr[data-status="${model.status}"]`).count();
      expect(status).toBeGreaterThan(0);
    }
    const statuses = summary.models.map((m: { status: string }) => m.status).sort();
    expect(statuses).toEqual(['disputed', 'invalid', 'verified']);
    await page.screenshot({ path: join(work, 'inventory.png'), fullPage: true });
  });

  it('filters the inventory by status and by text', async () => {
    await page.goto(server.url);
    await page.selectOption('#inventory-status', 'invalid');
    await expect.poll(() => page.locator('table.inventory tbody tr:not([hidden])').count()).toBe(1);
    await page.selectOption('#inventory-status', '');
    await page.fill('#inventory-search', 'sign error');
    const visible = page.locator('table.inventory tbody tr:not([hidden])');
    await expect.poll(() => visible.count()).toBe(1);
    expect(await visible.first().getAttribute('data-status')).toBe('disputed');
  });

  it('shows claims with verdicts, certificates and figures on a model page', async () => {
    const record = JSON.parse(readFileSync(join(results, 'models', 'site-chain.json'), 'utf8'));
    await page.goto(`${server.url}models/site-chain/`);
    const contradicted = record.claims.filter((c: { outcome: string }) => c.outcome === 'contradicted').length;
    expect(contradicted).toBeGreaterThan(0);
    expect(await page.locator('table.claims tr[data-outcome="contradicted"]').count()).toBe(contradicted);
    expect(await page.locator('table.claims details.certificate').count()).toBe(record.claims.length);
    expect(await page.locator('figure svg.plot').count()).toBeGreaterThan(0);
    await page.screenshot({ path: join(work, 'model.png'), fullPage: true });
  });

  it('renders untrusted Markdown safely, with math typeset', async () => {
    await page.goto(`${server.url}models/site-sheet/`);
    expect(await page.evaluate(() => (window as unknown as { __injected?: boolean }).__injected)).toBeUndefined();
    expect(await page.locator('.description script').count()).toBe(0);
    expect(await page.locator('.description .katex').count()).toBeGreaterThanOrEqual(2);
  });

  it('offers downloads identical to the records and the model file', async () => {
    const response = await page.request.get(`${server.url}data/records/site-sheet.json`);
    expect(response.status()).toBe(200);
    const downloaded = await response.json();
    const written = JSON.parse(readFileSync(join(results, 'models', 'site-sheet.json'), 'utf8'));
    expect(downloaded).toEqual(written);
    const source = await page.request.get(`${server.url}data/sources/site-sheet.json`);
    expect(await source.text()).toBe(readFileSync('test/fixtures/site/site-sheet.json', 'utf8'));
  });

  it('shows the located diagnostics of an invalid model', async () => {
    await page.goto(`${server.url}models/site-broken/`);
    const text = await page.locator('.diagnostic').first().textContent();
    expect(text).toMatch(/site-broken\.json:\d+:\d+/);
    expect(text).toContain('/drive/segments/0/hoppings/0/to');
    expect(text).toContain('no orbital "C"');
  });

  it('needs nothing the Content-Security-Policy forbids: no inline script, no inline handler, no console errors', async () => {
    violations.length = 0;
    for (const path of ['', 'models/site-sheet/', 'models/site-chain/', 'models/site-broken/', 'conventions/']) {
      const response = await page.goto(`${server.url}${path}`);
      expect(response?.headers()['content-security-policy']).toContain("script-src 'self'");
      const inline = await page.evaluate(() => ({
        scripts: [...document.querySelectorAll('script')].filter((s) => !s.src).length,
        handlers: [...document.querySelectorAll('*')].filter((e) => [...e.attributes].some((a) => a.name.startsWith('on'))).length,
      }));
      expect(inline, path).toEqual({ scripts: 0, handlers: 0 });
    }
    // The filter script still runs under the policy.
    await page.goto(server.url);
    await page.fill('#inventory-search', 'sign error');
    await expect.poll(() => page.locator('table.inventory tbody tr:not([hidden])').count()).toBe(1);
    expect(violations).toEqual([]);
  });
});
