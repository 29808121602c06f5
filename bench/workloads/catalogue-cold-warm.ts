/**
 * Workload: verify a generated catalogue of 100 two-band models (static
 * Qi–Wu–Zhang sheets, five-step checkerboard drives, two-step chains) with an
 * empty cache ("cold"), then again after changing one file ("warm": 99 cache
 * hits, one recomputation). Targets on a 2-core machine: cold ≤ 120 s, warm ≤ 10 s.
 * MODELS overrides the number of models, WORKERS the number of worker threads.
 */
import { mkdtempSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { measure } from '../measure.ts';
import { verifyCatalogue } from '../../src/catalogue/verify/catalogue.ts';
import { ResultCache } from '../../src/catalogue/cache/store.ts';

const COUNT = Number(process.env.MODELS ?? 100);
const WORKERS = process.env.WORKERS === undefined ? undefined : Number(process.env.WORKERS);
const COLD_TARGET_S = 120;
const WARM_TARGET_S = 10;

function header(id: string, title: string) {
  return {
    formatVersion: 1,
    id,
    title,
    summary: `Generated benchmark model ${id}.`,
    tags: ['benchmark'],
    maintainers: ['Lantern Lab benchmark generator'],
    dates: { created: '2026-11-30' },
  };
}

function qwz(id: string, m: number, period: number) {
  const lower = m > 0 && m < 2 ? 1 : m < 0 && m > -2 ? -1 : 0;
  return {
    ...header(id, `Qi-Wu-Zhang sheet, m = ${m}`),
    lattice: { dimension: 2, vectors: [[1, 0], [0, 1]], orbitals: [{ name: 'a', position: [0, 0] }, { name: 'b', position: [0, 0] }] },
    parameters: { m, T: period },
    drive: {
      period: 'T',
      segments: [{
        duration: 'T',
        onsite: [{ orbital: 'a', energy: 'm' }, { orbital: 'b', energy: '-m' }],
        hoppings: [
          { from: 'a', to: 'a', offset: [1, 0], amplitude: 0.5 },
          { from: 'a', to: 'a', offset: [0, 1], amplitude: 0.5 },
          { from: 'b', to: 'b', offset: [1, 0], amplitude: -0.5 },
          { from: 'b', to: 'b', offset: [0, 1], amplitude: -0.5 },
          { from: 'a', to: 'b', offset: [1, 0], amplitude: { re: 0, im: 0.5 } },
          { from: 'a', to: 'b', offset: [-1, 0], amplitude: { re: 0, im: -0.5 } },
          { from: 'a', to: 'b', offset: [0, -1], amplitude: 0.5 },
          { from: 'a', to: 'b', offset: [0, 1], amplitude: -0.5 },
        ],
      }],
    },
    claims: { bands: { cut: 1, chern: [lower, -lower] }, gaps: [{ quasienergy: 0, edgeModes: [{ finiteAlong: 1, end: 'low', count: lower }] }] },
    numerics: { ribbon: { width: 16, momenta: 48, finiteAlong: 1 } },
  };
}

function checkerboard(id: string, transfer: number, offset: number) {
  const bond = (j: number, n: number[]) => ({ label: `bond ${j}`, duration: 'tau', hoppings: [{ from: 'A', to: 'B', offset: n, amplitude: 'J' }] });
  return {
    ...header(id, `Five-step checkerboard drive, J tau = ${transfer.toFixed(3)}`),
    lattice: { dimension: 2, vectors: [[1, 1], [-1, 1]], orbitals: [{ name: 'A', position: [0, 0] }, { name: 'B', position: [1, 0] }] },
    parameters: { tau: 1, J: transfer, Delta: offset },
    drive: {
      period: '5*tau',
      segments: [bond(1, [0, 0]), bond(2, [0, 1]), bond(3, [-1, 1]), bond(4, [-1, 0]), { label: 'offset', duration: 'tau', onsite: [{ orbital: 'A', energy: 'Delta' }, { orbital: 'B', energy: '-Delta' }] }],
    },
    claims: { bands: { cut: 1, chern: [0, 0] }, anomalous: transfer > 1.2 },
    numerics: { ribbon: { width: 16, momenta: 48, finiteAlong: 1 } },
  };
}

function twoStep(id: string, theta1: number, theta2: number) {
  return {
    ...header(id, `Two-step chain, theta = (${theta1.toFixed(3)}, ${theta2.toFixed(3)})`),
    lattice: { dimension: 1, vectors: [[1]], orbitals: [{ name: 'a', position: [0] }, { name: 'b', position: [0.5] }] },
    parameters: { T: 1, theta1, theta2, J1: '2*theta1/T', J2: '2*theta2/T' },
    drive: {
      period: 'T',
      segments: [
        { duration: 'T/2', hoppings: [{ from: 'a', to: 'b', offset: [0], amplitude: 'J1' }] },
        { duration: 'T/2', hoppings: [{ from: 'b', to: 'a', offset: [1], amplitude: 'J2' }] },
      ],
    },
    claims: {
      symmetryClass: 'BDI',
      // Real hoppings: T = K holds in the symmetric frames, and with Γ it makes the class BDI.
      symmetries: { chiral: { operator: [[1, 0], [0, -1]], symmetricTimes: ['T/4', '3*T/4'] }, timeReversal: { unitary: [[1, 0], [0, 1]] } },
      gaps: [{ quasienergy: 0, invariant: theta2 > theta1 ? 1 : 0 }],
    },
    numerics: { chainLength: 40 },
  };
}

function generate(dir: string): string[] {
  const files: string[] = [];
  for (let i = 0; i < COUNT; i++) {
    const id = `bench-${String(i).padStart(3, '0')}`;
    const kind = i % 3;
    const x = (i * 0.618034) % 1; // golden-ratio sequence: varied, reproducible parameters
    const doc =
      kind === 0 ? qwz(id, [-3, -1.4, -0.6, 0.7, 1.3, 2.8][i % 6] + 0.1 * x, 0.4 + 0.2 * x)
      : kind === 1 ? checkerboard(id, (Math.PI / 2) * (0.85 + 0.15 * x), 0.3 + 0.4 * x)
      : twoStep(id, 0.2 + 1.2 * x, 0.3 + 2.4 * ((x * 7) % 1));
    const file = join(dir, `${id}.json`);
    writeFileSync(file, JSON.stringify(doc, null, 2));
    files.push(file);
  }
  return files;
}

await measure('catalogue-cold-warm', async () => {
  const root = mkdtempSync(join(tmpdir(), 'strobe-bench-catalogue-'));
  try {
    const models = join(root, 'models');
    mkdirSync(models);
    const files = generate(models);
    const options = { cache: new ResultCache(join(root, 'cache')), ...(WORKERS !== undefined ? { workers: WORKERS } : {}) };
    let t = performance.now();
    const cold = await verifyCatalogue([models], options);
    const coldSeconds = (performance.now() - t) / 1000;

    const changed = JSON.parse(readFileSync(files[1], 'utf8'));
    changed.parameters.Delta += 0.01;
    writeFileSync(files[1], JSON.stringify(changed, null, 2));
    t = performance.now();
    const warm = await verifyCatalogue([models], { ...options, cache: new ResultCache(join(root, 'cache')) });
    const warmSeconds = (performance.now() - t) / 1000;

    const statuses: Record<string, number> = {};
    for (const r of cold.records) statuses[r.status] = (statuses[r.status] ?? 0) + 1;
    return {
      models: COUNT,
      workers: WORKERS ?? 'default',
      coldSeconds,
      warmSeconds,
      coldTargetSeconds: COLD_TARGET_S,
      warmTargetSeconds: WARM_TARGET_S,
      coldWithinTarget: coldSeconds <= COLD_TARGET_S,
      warmWithinTarget: warmSeconds <= WARM_TARGET_S,
      statuses,
      warmCache: warm.cache,
      slowestCold: Object.entries(cold.timings).sort((a, b) => b[1].totalMs - a[1].totalMs).slice(0, 3).map(([id, tm]) => ({ id, seconds: tm.totalMs / 1000 })),
    };
  } finally {
    rmSync(root, { recursive: true, force: true });
  }
});
