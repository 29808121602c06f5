#!/usr/bin/env node
/**
 * Benchmark harness: `npm run bench [-- <name-filter> …]`.
 *
 * Every file bench/workloads/<name>.ts is one workload. Each runs in its own
 * fresh Node process (`node --import tsx`), and, when bench/numpy/<name>.py
 * exists and python3 with numpy is available, its numpy twin runs in its own
 * Python process with single-threaded BLAS. A workload prints one JSON line as
 * its last line of stdout: ideally {computeMs, result} (bench/measure.ts,
 * bench/numpy/_measure.py); a record with `seconds` instead of `computeMs` is
 * accepted, and any other fields become the result. The harness itself measures
 * the wall time of the whole process and its peak RSS (bench/peak-rss.mjs for
 * Node, resource.getrusage for Python), and prints one JSON document on stdout:
 * per workload, both sides and the ratio numpy/node of compute times (> 1: Node
 * is faster). Progress goes to stderr. Filters select workloads whose name
 * contains any of the given words.
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
const RSS_TAG = '@@peak-rss-kb ';
/** Runs a numpy twin and reports its peak RSS (kilobytes on Linux) the way peak-rss.mjs does for Node. */
const PYTHON_RUNNER = [
  'import os, resource, runpy, sys',
  'script = sys.argv[1]',
  'sys.argv = [script]',
  'sys.path.insert(0, os.path.dirname(os.path.abspath(script)))',
  'try:',
  '    runpy.run_path(script, run_name="__main__")',
  'finally:',
  `    sys.stderr.write("\\n${RSS_TAG}%d\\n" % resource.getrusage(resource.RUSAGE_SELF).ru_maxrss)`,
].join('\n');
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
      const rssLine = stderr.split('\n').find((l) => l.startsWith(RSS_TAG));
      const maxRssKb = rssLine ? Number(rssLine.slice(RSS_TAG.length)) : null;
      stderr = stderr
        .split('\n')
        .filter((l) => !l.startsWith(RSS_TAG))
        .join('\n');
      const last = stdout.trim().split('\n').pop() ?? '';
      let record;
      try {
        record = JSON.parse(last);
      } catch {
        record = undefined;
      }
      if (code !== 0 || record === undefined) {
        resolve({ wallMs, maxRssKb, error: signal ? `killed by ${signal}` : `exit code ${code}`, stderrTail: stderr.trim().split('\n').slice(-8).join('\n') });
        return;
      }
      const { computeMs, seconds, result, ...rest } = record;
      const compute = typeof computeMs === 'number' ? computeMs : typeof seconds === 'number' ? seconds * 1000 : undefined;
      resolve({ wallMs, computeMs: compute, maxRssKb, result: result ?? rest });
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
  const node = await run(process.execPath, ['--import', 'tsx', '--import', path.join(root, 'bench', 'peak-rss.mjs'), path.join(workloadDir, `${name}.ts`)], {});
  let numpy;
  const script = path.join(numpyDir, `${name}.py`);
  if (!existsSync(script)) numpy = { skipped: 'no numpy twin' };
  else if (!py.available) numpy = { skipped: py.reason };
  else {
    process.stderr.write(`bench: ${name} (numpy) …\n`);
    numpy = await run('python3', ['-c', PYTHON_RUNNER, script], SINGLE_THREAD);
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
