// End-to-end: verify a small inventory (test/fixtures/site: a sheet with a sweep, a
// chain with a sign error, a broken file and a draft), build the site from its
// records, serve it and read it in a real browser (Debian Chromium through
// playwright-core). Checks what a reader relies on: search by invariant and by tag,
// filters that survive a reload, sortable columns, model pages with math, the
// Hamiltonian, the lattice drawing and the verdicts of the records, no horizontal
// overflow on a 390 px phone, no console errors, untrusted Markdown inert, and no
// inline script anywhere (pages must run under script-src 'self').
// Screenshots go to test-results/site/ for a person to look at.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { verifyCatalogue } from '../../src/catalogue/verify/catalogue.ts';
import { writeResults } from '../../src/catalogue/records/write.ts';
import { serveStatic, type RunningServer } from '../../src/cli/static-server.ts';
import type { ModelRecord } from '../../src/catalogue/records/model-record.ts';

const CHROMIUM = '/usr/bin/chromium';
const hasBrowser = existsSync(CHROMIUM);
const SHOTS = join('test-results', 'site');

function htmlFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? htmlFiles(path) : name.endsWith('.html') ? [path] : [];
  });
}

describe.skipIf(!hasBrowser)('catalogue site in a browser', () => {
  const work = mkdtempSync(join(tmpdir(), 'strobe-site-'));
  const results = join(work, 'results');
  const dist = join(work, 'dist');
  let server: RunningServer;
  let context: BrowserContext;
  let page: Page;
  const consoleErrors: string[] = [];
  const record = (id: string) => JSON.parse(readFileSync(join(results, 'models', `${id}.json`), 'utf8')) as ModelRecord;
  const rows = () => page.locator('table.models tbody tr');
  const visibleIds = async () => (await rows().evaluateAll((trs) => trs.map((tr) => (tr as HTMLElement).dataset.id))) as string[];
  const noOverflow = () => page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth);

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
    page.on('console', (m) => {
      if (m.type() === 'error') consoleErrors.push(`${page.url()}: ${m.text()}`);
    });
    page.on('pageerror', (e) => consoleErrors.push(`${page.url()}: ${e.message}`));
    await page.setViewportSize({ width: 1366, height: 900 });
    mkdirSync(SHOTS, { recursive: true });
  }, 600_000);

  afterAll(async () => {
    await context?.close();
    await server?.close();
  });

  it('lists every published model with its status, counts by status, and leaves the draft out', async () => {
    await page.goto(server.url);
    expect((await visibleIds()).sort()).toEqual(['site-broken', 'site-chain', 'site-sheet']);
    expect(await page.locator('tr[data-id="site-chain"] .badge').textContent()).toContain('disputed');
    expect(await page.locator('tr[data-id="site-broken"] .badge').textContent()).toContain('invalid');
    // Disputed and invalid look different: not only in colour, but in mark and word.
    const marks = await page.locator('.status-counts .badge-mark').allTextContents();
    expect(new Set(marks).size).toBe(marks.length);
    expect(await page.locator('.status-counts').textContent()).toMatch(/disputed\s*1/);
    // The draft is verified, but not published: no row, no page.
    expect((await page.request.get(`${server.url}models/site-draft/`)).status()).toBe(404);
    // The table shows the computed invariants in physicists' notation.
    expect(await page.locator('tr[data-id="site-chain"] .c-inv').textContent()).toContain('ν0 = 1, νπ = −1');
    await page.screenshot({ path: join(SHOTS, 'inventory-1366.png'), fullPage: true });
  });

  it('searches by invariant, shows how it read the condition, and says when nothing matches', async () => {
    await page.goto(server.url);
    await page.fill('input[name="q"]', 'ν_π = ±1');
    await expect.poll(visibleIds).toEqual(['site-chain']);
    expect(await page.locator('#inventory-shown').textContent()).toContain('1 of 3 models where νπ = ±1');
    await page.fill('input[name="q"]', 'W = 1 in the 0 gap');
    await expect.poll(visibleIds).toEqual(['site-sheet']);
    await page.fill('input[name="q"]', 'C = 0 in every band');
    await expect.poll(() => rows().count()).toBe(0);
    expect(await page.locator('#inventory-empty').isVisible()).toBe(true);
    await page.fill('input[name="q"]', 'Quispe chain');
    await expect.poll(visibleIds).toEqual(['site-chain']);
  });

  it('filters by tag, and tags link to their browse page', async () => {
    await page.goto(server.url);
    await page.selectOption('select[name="tag"]', 'chern-insulator');
    await expect.poll(visibleIds).toEqual(['site-sheet']);
    await page.locator('tr[data-id="site-sheet"] a.tag', { hasText: 'chern-insulator' }).click();
    await page.waitForURL(/\/browse\/tag\/chern-insulator\/$/);
    expect(await visibleIds()).toEqual(['site-sheet']);
  });

  it('keeps the filter state in the URL, so a reload shows the same view', async () => {
    await page.goto(server.url);
    await page.fill('input[name="q"]', 'chain');
    await page.selectOption('select[name="status"]', 'disputed');
    await expect.poll(visibleIds).toEqual(['site-chain']);
    await expect.poll(() => new URL(page.url()).searchParams.get('status')).toBe('disputed');
    await page.reload();
    await expect.poll(visibleIds).toEqual(['site-chain']);
    expect(await page.inputValue('input[name="q"]')).toBe('chain');
    expect(await page.inputValue('select[name="status"]')).toBe('disputed');
  });

  it('sorts by a column, and the order is in the URL too', async () => {
    await page.goto(server.url);
    await page.locator('th button[data-sort="status"]').click();
    await expect.poll(visibleIds).toEqual(['site-chain', 'site-broken', 'site-sheet']);
    expect(await page.locator('th:has(button[data-sort="status"])').getAttribute('aria-sort')).toBe('ascending');
    await page.locator('th button[data-sort="status"]').click();
    await expect.poll(visibleIds).toEqual(['site-sheet', 'site-broken', 'site-chain']);
    expect(new URL(page.url()).searchParams.get('dir')).toBe('desc');
  });

  it('shows a model page with the verdicts of its record, each with its evidence one click away', async () => {
    const r = record('site-chain');
    await page.goto(`${server.url}models/site-chain/`);
    for (const outcome of ['confirmed', 'contradicted', 'unsettled']) {
      expect(await page.locator(`table.claims tr[data-outcome="${outcome}"]`).count()).toBe(r.claims.filter((c) => c.outcome === outcome).length);
    }
    expect(await page.locator('#verdict').textContent()).toContain('contradicted by recomputation');
    const row = page.locator('tr[data-claim="gap-0/invariant"]');
    expect(await row.locator('th').textContent()).toContain('ν0, the winding at ε = 0');
    expect(await row.textContent()).toContain('Likely cause');
    await row.locator('details.certificate summary').click();
    expect(await row.locator('details.certificate dl').isVisible()).toBe(true);
    expect(await row.locator('details.certificate dl').textContent()).toContain('symmetry');
    await page.screenshot({ path: join(SHOTS, 'model-chain-1366.png'), fullPage: true });
  });

  it('shows math, the Hamiltonian of every segment, the lattice drawing and the figures', async () => {
    await page.goto(`${server.url}models/site-sheet/`);
    expect(await page.locator('.description .katex').count()).toBeGreaterThanOrEqual(2);
    const segments = page.locator('section:has(#hamiltonian) ol.segments > li');
    expect(await segments.count()).toBe(1);
    const formula = await segments.first().locator('.math-scroll .katex-mathml annotation').textContent();
    expect(formula).toContain('c^\\dagger_{A,\\mathbf R+\\mathbf a_1} c_{A,\\mathbf R}');
    expect(formula).toContain('\\mathrm{h.c.}');
    const cell = page.locator('.figure-cell svg.plot');
    expect(await cell.getAttribute('aria-label')).toContain('Unit cell');
    expect(await page.locator('.figure-segment svg').count()).toBe(1);
    expect(await page.locator('section:has(#bands) svg.plot').count()).toBe(2);
    expect(await page.locator('#ribbon-2 svg.plot').count()).toBe(1);
    // The mass sweep is a step plot with the gap beneath, the model's own mass marked.
    const sweep = page.locator('#sweep-mass svg.plot');
    expect(await sweep.textContent()).toContain('this model');
    expect(await page.locator('details.bibtex pre').textContent()).toContain('@misc{strobe-atlas:site-sheet');
    await page.screenshot({ path: join(SHOTS, 'model-sheet-1366.png'), fullPage: true });
  });

  it('renders untrusted Markdown inert, with math typeset', async () => {
    await page.goto(`${server.url}models/site-sheet/`);
    expect(await page.evaluate(() => (window as unknown as { __injected?: boolean }).__injected)).toBeUndefined();
    expect(await page.locator('.description script').count()).toBe(0);
    expect(await page.locator('.description img[onerror]').count()).toBe(0);
  });

  it('tells an invalid file apart from one without claims, with located problems', async () => {
    await page.goto(`${server.url}models/site-broken/`);
    expect(await page.locator('#verdict').textContent()).toContain('could not be loaded');
    expect(await page.content()).not.toContain('states no claims');
    const text = await page.locator('.diagnostic').first().textContent();
    expect(text).toMatch(/site-broken\.json:\d+:\d+/);
    expect(text).toContain('/drive/segments/0/hoppings/0/to');
  });

  it('lists what needs attention with the reason for each claim', async () => {
    await page.goto(`${server.url}browse/attention/`);
    const items = page.locator('ol.attention > li');
    expect(await items.evaluateAll((lis) => lis.map((li) => (li as HTMLElement).dataset.status))).toEqual(['disputed', 'invalid']);
    expect(await items.first().textContent()).toContain('but the file claims −1');
  });

  it('offers downloads identical to the records and the model file', async () => {
    const downloaded = await (await page.request.get(`${server.url}data/records/site-sheet.json`)).json();
    expect(downloaded).toEqual(record('site-sheet'));
    const source = await page.request.get(`${server.url}data/sources/site-sheet.json`);
    expect(await source.text()).toBe(readFileSync('test/fixtures/site/site-sheet.json', 'utf8'));
    const schema = await page.request.get(`${server.url}schemas/report.schema.json`);
    expect((await schema.json()).$id).toBe('report.schema.json');
  });

  it('has no horizontal overflow on a 390 px phone', async () => {
    await page.setViewportSize({ width: 390, height: 844 });
    try {
      for (const [path, name] of [['', 'inventory'], ['models/site-sheet/', 'model-sheet'], ['models/site-chain/', 'model-chain'], ['models/site-broken/', 'model-broken'], ['browse/', 'browse'], ['browse/attention/', 'attention'], ['docs/conventions/', 'conventions'], ['docs/model-format/', 'model-format'], ['docs/results-records/', 'results-records']]) {
        await page.goto(`${server.url}${path}`);
        expect(await noOverflow(), path).toBe(true);
        await page.screenshot({ path: join(SHOTS, `${name}-390.png`), fullPage: true });
      }
    } finally {
      await page.setViewportSize({ width: 1366, height: 900 });
    }
  });

  it('renders the conventions without raw table syntax or TeX', async () => {
    await page.goto(`${server.url}docs/conventions/`);
    const text = await page.locator('.document').evaluate((el) => {
      const clone = el.cloneNode(true) as HTMLElement;
      clone.querySelectorAll('code, pre, .katex-mathml').forEach((n) => n.remove());
      return clone.textContent ?? '';
    });
    expect(text).not.toMatch(/\|\s*-{3}|[_^]\{|\$/);
    expect(await page.locator('.document table').count()).toBeGreaterThan(0);
  });

  it('ships no inline script or event handler (pages run under script-src \'self\')', () => {
    for (const file of htmlFiles(dist)) {
      const html = readFileSync(file, 'utf8');
      expect(html, file).not.toMatch(/<script(?![^>]*\bsrc=)[^>]*>/i);
      expect(html, file).not.toMatch(/\son[a-z]+\s*=/i);
    }
  });

  it('logged no console errors on any page', () => {
    expect(consoleErrors).toEqual([]);
  });

  it('needs nothing the Content-Security-Policy forbids: no inline script, no inline handler, no console errors', async () => {
    consoleErrors.length = 0;
    for (const path of ['', 'models/site-sheet/', 'models/site-chain/', 'models/site-broken/', 'docs/conventions/', 'browse/']) {
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
    await page.fill('input[name="q"]', 'sign error');
    await expect.poll(() => visibleIds()).toEqual(['site-chain']);
    expect(consoleErrors).toEqual([]);
  });
});
