/**
 * Workload: the site for an inventory of 1,000 models whose results are
 * already computed ("cached"). The models of models/ are verified once (through
 * the result cache, so a warm run computes nothing), then cloned into 1,000
 * entries with their own ids, titles, tags and maintainers (the physics, and so
 * every verdict, figure and sweep, is that of the model cloned), written as
 * model files and results records, and the site is built from them.
 *
 * Measured: the wall time of the site build (target < 3 min on a 2-core
 * machine), the size of the search index (target < 1 MB) and of the rows the
 * search script lists (reported beside it: the two are what the inventory page
 * loads), and the largest page (target < 300 KB). MODELS overrides the number
 * of entries.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { measure } from '../measure.ts';
import { verifyCatalogue } from '../../src/catalogue/verify/catalogue.ts';
import { writeResults } from '../../src/catalogue/records/write.ts';
import { summarize } from '../../src/catalogue/records/summary.ts';
import type { ModelRecord } from '../../src/catalogue/records/model-record.ts';
import { inventoryPath, sourceHash } from '../../src/catalogue/inventory.ts';
import { seededRandom } from '../../test/support/random.ts';

const COUNT = Number(process.env.MODELS ?? 1000);
const BUILD_TARGET_S = 180;
const INDEX_TARGET_BYTES = 1024 * 1024;
const PAGE_TARGET_BYTES = 300 * 1024;

const WORDS = ['lattice', 'drive', 'Floquet', 'chiral', 'edge', 'ribbon', 'winding', 'Chern', 'kagome', 'honeycomb', 'square', 'chain', 'pumped', 'kicked', 'harmonic', 'sublattice', 'staggered', 'anisotropic', 'dimerised', 'shaken'];
const TAGS = ['benchmark', 'anomalous', 'chern-insulator', 'step-drive', 'kicked', 'high-frequency', 'pi-modes', 'majorana', 'flat-band', 'chiral', 'class-d', 'near-critical', 'collaborator', 'sweep', 'light', 'static', 'square-lattice', 'honeycomb', 'kagome', 'lieb'];
const PEOPLE = ['Tomasz Brightwater', 'Ines Varga-Holm', 'Amaru Quispe-Lindqvist', 'Saoirse Ndiaye-Kowal', 'Henrik Obuya', 'Lin Marchetti', 'Priya Solberg', 'Oskar Mbeki-Laine'];

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? files(path) : [path];
  });
}

await measure('site-thousand', async () => {
  const base = await verifyCatalogue(['models'], { workers: 0 });
  const sources = base.records.filter((r) => r.status !== 'invalid');
  const work = mkdtempSync(join(tmpdir(), 'strobe-site-bench-'));
  const modelsDir = join(work, 'models');
  mkdirSync(modelsDir, { recursive: true });
  const rand = seededRandom(20261201);
  const pick = <T>(list: T[]) => list[Math.floor(rand() * list.length)];
  const records: ModelRecord[] = [];
  for (let i = 0; i < COUNT; i++) {
    const from = sources[i % sources.length];
    const id = `bench-${String(i).padStart(4, '0')}-${from.id}`.slice(0, 64).replace(/-+$/, '');
    const title = `${pick(WORDS)} ${pick(WORDS)} variant ${i} of ${from.model?.title ?? from.id}`.slice(0, 200);
    const tags = [...new Set(['benchmark', pick(TAGS), pick(TAGS), ...(from.model?.tags ?? [])])];
    const maintainers = [`${pick(PEOPLE)} (Lantern Lab, Ostvik University)`, `${pick(PEOPLE)} (Lantern Lab, Ostvik University)`];
    const document = JSON.parse(readFileSync(from.file, 'utf8'));
    // Each clone gets a description of its own, so that nothing is rendered once and reused.
    const description = `${document.description ?? ''}\n\nVariant ${i}: ${pick(WORDS)} and ${pick(WORDS)} at $\\lambda_{${i}} = ${(rand() * 2).toFixed(3)}$.`;
    Object.assign(document, { id, title, tags, maintainers, description, $schema: undefined });
    const file = join(modelsDir, `${id}.json`);
    const text = JSON.stringify(document, null, 2);
    writeFileSync(file, text);
    // The site publishes a record only when it matches the inventory's file as it is now.
    records.push({ ...from, id, file: inventoryPath(file), sourceHash: sourceHash(text), model: from.model ? { ...from.model, title, tags, maintainers, description } : null });
  }
  const summary = summarize(records, base.summary.engine, null);
  const results = join(work, 'results');
  writeResults(results, records, summary, {});
  const dist = join(work, 'dist');
  const t0 = performance.now();
  const build = spawnSync(process.execPath, ['node_modules/astro/astro.js', 'build', '--silent', '--outDir', dist], { env: { ...process.env, STROBE_RESULTS: results, STROBE_INVENTORY: JSON.stringify([modelsDir]) }, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  const buildSeconds = (performance.now() - t0) / 1000;
  if (build.status !== 0) throw new Error(`site build failed:\n${build.stderr.slice(-4000)}`);
  const pages = files(dist).filter((f) => f.endsWith('.html')).map((f) => ({ file: f.slice(dist.length + 1), bytes: statSync(f).size }));
  const largest = pages.reduce((a, b) => (b.bytes > a.bytes ? b : a));
  const modelPages = pages.filter((p) => p.file.startsWith('models/'));
  if (modelPages.length !== COUNT) throw new Error(`expected ${COUNT} model pages, the site has ${modelPages.length}:\n${build.stderr.slice(-4000)}`);
  const index = statSync(join(dist, 'search', 'index.json')).size;
  const rows = statSync(join(dist, 'search', 'rows.json')).size;
  rmSync(work, { recursive: true, force: true });
  return {
    models: COUNT,
    clonedFrom: sources.map((r) => r.id),
    buildSeconds: Number(buildSeconds.toFixed(1)),
    buildTargetSeconds: BUILD_TARGET_S,
    htmlPages: pages.length,
    largestPage: { file: largest.file, kilobytes: Number((largest.bytes / 1024).toFixed(1)) },
    largestModelPageKilobytes: Number((Math.max(...modelPages.map((p) => p.bytes)) / 1024).toFixed(1)),
    searchIndexKilobytes: Number((index / 1024).toFixed(1)),
    searchRowsKilobytes: Number((rows / 1024).toFixed(1)),
    searchDataKilobytes: Number(((index + rows) / 1024).toFixed(1)),
    targetsMet: { build: buildSeconds < BUILD_TARGET_S, searchIndex: index < INDEX_TARGET_BYTES, largestPage: largest.bytes < PAGE_TARGET_BYTES },
  };
});
