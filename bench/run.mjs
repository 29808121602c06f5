#!/usr/bin/env node
/**
 * Benchmark harness: `npm run bench [-- <name-filter> …]`.
 *
 * Every file bench/workloads/<name>.ts is one workload. Each runs in its own
 * fresh Node process (`node --import tsx`), and, when bench/numpy/<name>.py
 * exists and python3 with numpy is available, its numpy twin runs in its own
 * Python process with single-threaded BLAS. Both print one JSON line (see
 * bench/measure.ts and bench/numpy/_measure.py); this script collects them and
 * prints one JSON document on stdout: wall time of the whole process, compute
 * time of the workload itself, peak RSS, the workload's own result summary, and
 * the ratio numpy/node of compute times (> 1: Node is faster). Progress goes
 * to stderr. Filters select workloads whose name contains any of the words.
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const workloadDir = path.join(root, 'bench', 'workloads');
const numpyDir = path.join(root, 'bench', 'numpy');
const TIMEOUT_MS = 30 * 60 * 1000;
const SINGLE_THREAD = {
  OPENBLAS_NUM_THREADS: '1',
  OMP_NUM_THREADS: '1',
  MKL_NUM_THREADS: '1',
  NUMEXPR_NUM_THREADS: '1',
  VECLIB_MAXIMUM_THREADS: '1',
};

function run(command, args, env) {
  return new Promise((resolve) => {
    const t0 = performance.now();
    const child = spawn(command, args, { cwd: root, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '', stderr = '';
    child.stdout.on('data', (d) => (stdout += d));
    child.stderr.on('data', (d) => (stderr += d));
    const timer = setTimeout(() => child.kill('SIGKILL'), TIMEOUT_MS);
    child.on('error', (e) => {
      clearTimeout(timer);
      resolve({ error: `could not start ${command}: ${e.message}` });
    });
    child.on('close', (code, signal) => {
      clearTimeout(timer);
      const wallMs = performance.now() - t0;
      const last = stdout.trim().split('\n').pop() ?? '';
      let record;
      try {
        record = JSON.parse(last);
      } catch {
        record = undefined;
      }
      if (code !== 0 || record === undefined) {
        resolve({ wallMs, error: signal ? `killed by ${signal}` : `exit code ${code}`, stderrTail: stderr.trim().split('\n').slice(-8).join('\n') });
        return;
      }
      resolve({ wallMs, computeMs: record.computeMs, maxRssKb: record.maxRssKb, ...(record.numpy ? { numpy: record.numpy } : {}), result: record.result });
    });
  });
}

function pythonStatus() {
  const probe = spawnSync('python3', ['-c', 'import sys, numpy; print(sys.version.split()[0], numpy.__version__)'], { encoding: 'utf8' });
  if (probe.error) return { available: false, reason: 'python3 not found: numpy twins skipped' };
  if (probe.status !== 0) return { available: false, reason: 'numpy not importable in python3: numpy twins skipped' };
  const [python, numpy] = probe.stdout.trim().split(' ');
  return { available: true, python, numpy };
}

const filters = process.argv.slice(2).filter((x) => x.length > 0);
const names = readdirSync(workloadDir)
  .filter((f) => f.endsWith('.ts'))
  .map((f) => f.slice(0, -3))
  .filter((name) => filters.length === 0 || filters.some((w) => name.includes(w)))
  .sort();
const py = pythonStatus();
const results = [];
for (const name of names) {
  process.stderr.write(`bench: ${name} (node) …\n`);
  const node = await run(process.execPath, ['--import', 'tsx', path.join(workloadDir, `${name}.ts`)], {});
  let numpy;
  const script = path.join(numpyDir, `${name}.py`);
  if (!existsSync(script)) numpy = { skipped: 'no numpy twin' };
  else if (!py.available) numpy = { skipped: py.reason };
  else {
    process.stderr.write(`bench: ${name} (numpy) …\n`);
    numpy = await run('python3', [script], SINGLE_THREAD);
  }
  const entry = { name, node, numpy };
  if (node.computeMs !== undefined && numpy.computeMs !== undefined) entry.numpyOverNode = numpy.computeMs / node.computeMs;
  results.push(entry);
}

const doc = {
  generated: new Date().toISOString(),
  machine: { node: process.version, platform: `${os.platform()} ${os.arch()}`, cpus: os.cpus().length, cpuModel: os.cpus()[0]?.model ?? 'unknown', loadAverage: os.loadavg() },
  python: py,
  filters,
  workloads: results,
};
process.stdout.write(`${JSON.stringify(doc, null, 2)}\n`);
if (names.length === 0) process.stderr.write(`bench: no workload matches ${filters.join(', ')}\n`);
