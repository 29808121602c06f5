/**
 * Terminal output and options of verification runs, for the `check` command
 * (which calls runVerifiedCheck) and `merge`:
 *   strobe check [paths…] [--workers N] [--no-cache] [--cache-dir DIR]
 *                [--shard i/n | --shard-from VAR/n [--shard-base 0|1]] [--time-limit S]
 *                [--strict] [--json] [--junit FILE] [--out DIR]
 *   strobe merge <summary.json | shard dir | sweep part…> [--out FILE]
 * Exit status: 0 unless a model is disputed, invalid or failed (1); --strict
 * also fails on unsettled models. Usage errors exit with 2.
 */
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync, mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { formatDiagnostic } from '../../catalogue/diagnostics.ts';
import type { CatalogueReport, ProgressEvent } from '../../catalogue/verify/catalogue.ts';
import { verifyCatalogue } from '../../catalogue/verify/catalogue.ts';
import type { CatalogueSummary, ModelRecord } from '../../catalogue/records/model-record.ts';
import { canonicalJson } from '../../catalogue/records/canonical-json.ts';
import { finishResults, removeStaleTemporaries, writeRecordFile } from '../../catalogue/records/write.ts';
import { DEFAULT_MEMORY_LIMIT_BYTES, DEFAULT_TIME_LIMIT_SECONDS } from '../../catalogue/budget/limits.ts';
import { mergeSummaries, MergeError } from '../../catalogue/records/summary.ts';
import { reportProblems } from '../../catalogue/records/report-validation.ts';
import { exitCodeFor } from '../../catalogue/verify/status.ts';
import { junitXml, type JunitSuite } from '../../catalogue/junit.ts';
import { resolveShard, ShardSpecError, type ShardSpec } from '../../catalogue/shard.ts';
import { cacheRoot, ResultCache } from '../../catalogue/cache/store.ts';
import { completeRecords, readSweepParts, writeSweepParts } from '../../catalogue/records/shard-records.ts';
import { isSweepPart, mergeSweepParts, SweepMergeError, type SweepPart } from '../../catalogue/sweep/sweep-part.ts';
import { modelStatusOfStep } from '../../catalogue/workers/status-step.ts';
import { ANOMALOUS_LABEL, STATUS_LABEL, STATUS_ORDER, count, quantityName } from '../../catalogue/vocabulary.ts';

/** Where commands write: process.stdout / process.stderr fit this shape. */
export interface CliIO {
  stdout: { write(text: string): unknown; isTTY?: boolean };
  stderr: { write(text: string): unknown };
}

export class UsageError extends Error {}

export interface CheckOptions {
  paths: string[];
  workers?: number;
  cache: boolean;
  cacheDir?: string;
  shard?: ShardSpec;
  timeLimitSeconds?: number;
  memoryLimitBytes?: number;
  strict: boolean;
  json: boolean;
  junit?: string;
  out: string;
}

export const describeCheckOptions = `Options of strobe check (verification):
  --workers N      worker threads (default: number of cores; 0 = run in this process,
                   where no time limit can stop a model: the work estimate still refuses
                   what is too large, and with --time-limit one worker thread is used)
  --no-cache       recompute every model (default: reuse .strobe-cache/ for unchanged models)
  --cache-dir DIR  keep the result cache in DIR (default $STROBE_CACHE_DIR, else .strobe-cache/): a
                   directory CI restores and saves, or one shared by the jobs of an array job
  --shard i/n      run shard i of n for parallel jobs: the models of the shard (split by a hash of
                   the model id) and the shard's points of every declared sweep (point p goes to
                   shard (p mod n) + 1); join the shards with strobe merge
  --shard-from VAR/n   the same, with i read from environment variable VAR (an array job's task
                   index: SLURM_ARRAY_TASK_ID, PBS_ARRAY_INDEX, SGE_TASK_ID, LSB_JOBINDEX,
                   CI_NODE_INDEX …; n may name a variable too, e.g. CI_NODE_INDEX/CI_NODE_TOTAL)
  --shard-base 0|1 whether VAR counts from 0 or from 1 (default 1)
  --time-limit S   time limit per model, seconds, for every model (default: the model's
                   numerics.timeLimit, else ${DEFAULT_TIME_LIMIT_SECONDS} s). A model whose estimated work
                   exceeds it is refused before computing, naming the field and the
                   estimate; one that runs over it is stopped and reported as failed
                   (models run in worker threads, so the limit holds for every --workers)
  --memory-limit MB  memory budget per model (default ${DEFAULT_MEMORY_LIMIT_BYTES / 1e6}); a model whose
                   estimated memory exceeds it is refused; it also caps the
                   JavaScript heap of each worker thread (at least 512 MB)
  --strict         also fail when a model is unsettled
  --json           print the catalogue summary as JSON instead of the table
  --junit FILE     also write a JUnit XML report (one test case per claim)
  --out DIR        where results records go (default results). Each model's record is
                   written as soon as it finishes; checking some files replaces only
                   their records, and results/catalogue.json summarises every record
Exit status: 0 when no model is disputed, invalid or failed; 1 otherwise; 2 on a usage error.`;

function takeValue(argv: string[], i: number, flag: string): string {
  const v = argv[i + 1];
  if (v === undefined || v.startsWith('--')) throw new UsageError(`${flag} needs a value`);
  return v;
}

export function parseCheckOptions(argv: string[], env: Record<string, string | undefined> = process.env): CheckOptions {
  const o: CheckOptions = { paths: [], cache: true, strict: false, json: false, out: 'results' };
  const shard: { shard?: string; shardFrom?: string; shardBase?: string } = {};
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const [flag, inline] = a.startsWith('--') && a.includes('=') ? [a.slice(0, a.indexOf('=')), a.slice(a.indexOf('=') + 1)] : [a, undefined];
    const value = () => {
      if (inline !== undefined) return inline;
      const v = takeValue(argv, i, flag);
      i++;
      return v;
    };
    switch (flag) {
      case '--workers': {
        const v = value();
        const n = Number(v);
        if (!Number.isInteger(n) || n < 0) throw new UsageError(`--workers expects a whole number ≥ 0, got "${v}"`);
        o.workers = n;
        break;
      }
      case '--no-cache':
        o.cache = false;
        break;
      case '--cache-dir':
        o.cacheDir = value();
        break;
      case '--shard':
        shard.shard = value();
        break;
      case '--shard-from':
        shard.shardFrom = value();
        break;
      case '--shard-base':
        shard.shardBase = value();
        break;
      case '--time-limit': {
        const v = value();
        const s = Number(v);
        if (!Number.isFinite(s) || s <= 0) throw new UsageError(`--time-limit expects seconds > 0, got "${v}"`);
        o.timeLimitSeconds = s;
        break;
      }
      case '--memory-limit': {
        const v = value();
        const mb = Number(v);
        if (!Number.isFinite(mb) || mb <= 0) throw new UsageError(`--memory-limit expects megabytes > 0, got "${v}"`);
        o.memoryLimitBytes = mb * 1e6;
        break;
      }
      case '--strict':
        o.strict = true;
        break;
      case '--json':
        o.json = true;
        break;
      case '--junit':
        o.junit = value();
        break;
      case '--out':
        o.out = value();
        break;
      default:
        if (a.startsWith('--')) throw new UsageError(`unknown option ${a}; see "strobe help check"`);
        o.paths.push(a);
    }
  }
  try {
    const spec = resolveShard(shard, env);
    if (spec !== undefined) o.shard = spec;
  } catch (e) {
    if (e instanceof ShardSpecError) throw new UsageError(e.message);
    throw e;
  }
  return o;
}

const seconds = (ms: number) => `${(ms / 1000).toFixed(1)} s`;

/** Steps that end a model's run. */
const FINISHED_STEPS = new Set(['done', 'cached', 'timed-out', 'crashed', 'threw', 'over-budget']);

/** What a finished model's line says after its name. */
function finishedText(step: string, status: string | undefined, elapsedMs: number): string {
  if (step === 'cached') return 'cached (unchanged)';
  if (step === 'over-budget') return 'refused: estimated work over its limits';
  if (step === 'done') return `${status ?? 'done'} in ${seconds(elapsedMs)}`;
  return `${step} ${seconds(elapsedMs)}`;
}

/**
 * Progress reporter: on a terminal, one line rewritten in place with the model
 * being computed, its step and the elapsed time (refreshed twice a second);
 * otherwise one plain line per finished model with its status
 * ("[1/1] kick-qwz: unsettled in 4.0 s"), which logs read well, and every
 * `heartbeatMs` (10 s) a line per model still running, so that a log never
 * falls silent for long.
 */
export function progressReporter(io: CliIO, refreshMs = 500, heartbeatMs = 10_000): { onProgress: (e: ProgressEvent) => void; finish: () => void } {
  const tty = io.stdout.isTTY === true;
  let done = 0;
  let width = 0;
  let current: { event: ProgressEvent; at: number } | undefined;
  let timer: NodeJS.Timeout | undefined;
  const running = new Map<string, { event: ProgressEvent; at: number }>();
  const statuses = new Map<string, string>();
  const render = (e: ProgressEvent, extraMs = 0) => {
    const line = `[${done}/${e.total}] ${e.id}: ${e.step} ${seconds(e.elapsedMs + extraMs)}`;
    io.stdout.write(`\r${line.padEnd(width)}`);
    width = line.length;
  };
  const heartbeat = () => {
    const now = performance.now();
    for (const { event, at } of running.values()) {
      io.stdout.write(`[${done}/${event.total}] ${event.id}: still running (${event.step}), ${seconds(event.elapsedMs + now - at)}\n`);
    }
  };
  const startTimer = () => {
    if (timer) return;
    const every = tty ? refreshMs : heartbeatMs;
    if (every <= 0) return;
    timer = setInterval(() => {
      if (!tty) heartbeat();
      else if (current) render(current.event, performance.now() - current.at);
    }, every);
    timer.unref();
  };
  return {
    onProgress(e) {
      const status = modelStatusOfStep(e.step);
      if (status !== undefined) {
        statuses.set(e.id, status);
        return;
      }
      const finished = FINISHED_STEPS.has(e.step);
      if (finished) {
        done++;
        running.delete(e.id);
      } else running.set(e.id, { event: e, at: performance.now() });
      if (tty) {
        render(e);
        current = finished ? undefined : { event: e, at: performance.now() };
      } else if (finished) {
        io.stdout.write(`[${done}/${e.total}] ${e.id}: ${finishedText(e.step, statuses.get(e.id), e.elapsedMs)}\n`);
      }
      startTimer();
    },
    finish() {
      if (timer) clearInterval(timer);
      timer = undefined;
      if (tty && width > 0) io.stdout.write(`\r${' '.repeat(width)}\r`);
    },
  };
}

/** The summary table: one line per model, then totals. */
export function summaryTable(report: Pick<CatalogueReport, 'records' | 'timings'>): string {
  const rows = report.records.map((r) => [
    r.model?.draft ? `${r.id} (draft)` : r.id,
    STATUS_LABEL[r.status],
    `${r.counts.confirmed}/${r.counts.contradicted}/${r.counts.unsettled}`,
    ANOMALOUS_LABEL[r.anomalous.classification],
    report.timings[r.id]?.cached ? 'cached' : seconds(report.timings[r.id]?.totalMs ?? 0),
  ]);
  const header = ['model', 'status', 'claims ✓/✗/?', 'anomalous', 'time'];
  const widths = header.map((h, c) => Math.max(h.length, ...rows.map((row) => row[c].length)));
  const fmt = (row: string[]) => row.map((cell, c) => cell.padEnd(widths[c])).join('  ').trimEnd();
  const lines = [fmt(header), widths.map((w) => '─'.repeat(w)).join('  '), ...rows.map(fmt)];
  const counts = STATUS_ORDER.map((s) => [s, report.records.filter((r) => r.status === s).length] as const).filter(([, n]) => n > 0);
  lines.push('', `${count(report.records.length, 'model')}: ${counts.map(([s, n]) => `${n} ${STATUS_LABEL[s]}`).join(', ') || 'none'}`);
  const drafts = report.records.filter((r) => r.model?.draft).length;
  if (drafts > 0) lines.push(`${count(drafts, 'draft')} (verified, but not published on the site until "draft": true is removed)`);
  return lines.join('\n') + '\n';
}

/** What went wrong, model by model: contradictions with hints, unsettled reasons, diagnostics, and the warnings of every model. */
export function problemDetails(records: ModelRecord[]): string {
  const out: string[] = [];
  for (const r of records) {
    const warnings = r.diagnostics.filter((d) => d.severity === 'warning');
    if (r.status === 'invalid') {
      out.push(`${r.id}: invalid`);
      for (const d of r.diagnostics) out.push(`  ${formatDiagnostic(d)}`);
    } else if (r.status === 'failed') {
      out.push(`${r.id}: failed${r.incident?.kind === 'over-budget' ? ' (refused before computing)' : `: ${r.incident?.message ?? r.statusReason}`}`);
      for (const d of r.diagnostics) out.push(`  ${formatDiagnostic(d)}`);
    } else {
      const bad = r.claims.filter((v) => v.outcome !== 'confirmed');
      if (bad.length === 0 && warnings.length === 0) continue;
      out.push(`${r.id}: ${STATUS_LABEL[r.status]}`);
      for (const v of bad) {
        const name = quantityName(v.claim, { symmetryClass: r.model?.symmetryClass, cut: v.kind === 'chern' ? v.gap : null }).words;
        out.push(`  ${r.file} ${v.pointer}  ${name}: ${v.outcome}: ${v.message}`);
        if (v.hint) out.push(`    hint: ${v.hint}`);
      }
      for (const d of warnings) out.push(`  ${formatDiagnostic(d)}`);
    }
  }
  return out.length > 0 ? out.join('\n') + '\n' : '';
}

export function junitSuites(report: Pick<CatalogueReport, 'records' | 'timings'>, strict: boolean): JunitSuite[] {
  return report.records.map((r) => {
    const time = (report.timings[r.id]?.totalMs ?? 0) / 1000;
    if (r.status === 'invalid' || r.status === 'failed') {
      const message = r.status === 'invalid' ? `invalid: ${r.statusReason}` : `failed: ${r.statusReason}`;
      const detail = r.diagnostics.map((d) => `${d.file}:${d.line}:${d.column} ${d.pointer} ${d.message}${d.hint ? ` (${d.hint})` : ''}`).join('\n');
      return { name: r.id, timeSeconds: time, cases: [{ name: 'load and compute', classname: r.id, timeSeconds: time, outcome: 'error' as const, message, detail }] };
    }
    // Compute time is measured per model, not per claim: the suite carries it and cases report 0.
    const share = 0;
    return {
      name: r.id,
      timeSeconds: time,
      cases: r.claims.map((v) => {
        const detail = [v.hint ? `hint: ${v.hint}` : '', ...v.certificate.notes].filter(Boolean).join('\n');
        if (v.outcome === 'confirmed') return { name: v.claim, classname: r.id, timeSeconds: share, outcome: 'pass' as const };
        const outcome = v.outcome === 'contradicted' || strict ? ('failure' as const) : ('skipped' as const);
        return { name: v.claim, classname: r.id, timeSeconds: share, outcome, message: v.message, detail };
      }),
    };
  });
}

function writeFileEnsuringDir(file: string, text: string): void {
  mkdirSync(dirname(file), { recursive: true });
  writeFileSync(file, text);
}

/** strobe check with verification: verify, write records, print, return the exit status. */
export async function runVerifiedCheck(argv: string[], io: CliIO, env: Record<string, string | undefined> = process.env): Promise<number> {
  let options: CheckOptions;
  try {
    options = parseCheckOptions(argv, env);
  } catch (e) {
    if (e instanceof UsageError) {
      io.stderr.write(`strobe check: ${e.message}\n`);
      return 2;
    }
    throw e;
  }
  const progress = options.json ? undefined : progressReporter(io);
  removeStaleTemporaries(join(options.out, 'models'));
  const report = await verifyCatalogue(options.paths.length > 0 ? options.paths : ['models'], {
    cache: options.cache ? new ResultCache(cacheRoot(options.cacheDir, env)) : false,
    ...(options.workers !== undefined ? { workers: options.workers } : {}),
    ...(options.shard ? { shard: options.shard } : {}),
    ...(options.timeLimitSeconds !== undefined ? { timeLimitSeconds: options.timeLimitSeconds } : {}),
    ...(options.memoryLimitBytes !== undefined ? { memoryLimitBytes: options.memoryLimitBytes } : {}),
    ...(progress ? { onProgress: progress.onProgress } : {}),
    // Each record reaches the disk before its progress line is printed: a killed run keeps what it reported.
    onRecord: (record) => void writeRecordFile(options.out, record),
  });
  progress?.finish();
  // Only a run over the whole inventory knows which records are no longer wanted.
  const whole = !options.shard && options.paths.length === 0;
  const finished = finishResults(options.out, report.summary, report.timings, whole ? { keep: new Set(report.records.map((r) => r.id)) } : {});
  for (const problem of finished.problems) io.stderr.write(`warning: left out of ${join(options.out, 'catalogue.json')}: ${problem}\n`);
  const parts = writeSweepParts(options.out, report.sweepParts);
  for (const problem of report.cacheProblems) io.stderr.write(`warning: corrupt cache entry recomputed: ${problem}\n`);
  if (options.junit) writeFileEnsuringDir(options.junit, junitXml('strobe check', junitSuites(report, options.strict)));
  if (options.json) io.stdout.write(canonicalJson(report.summary));
  else {
    io.stdout.write(summaryTable(report));
    const details = problemDetails(report.records);
    if (details) io.stdout.write(`\n${details}`);
    io.stdout.write(`\nresults written to ${options.out}/\n`);
    if (parts.length > 0) io.stdout.write(`${parts.length} sweep part(s) of this shard written to ${options.out}/sweep-parts/: the records get their sweeps back from strobe merge\n`);
  }
  return exitCodeFor(report.records.map((r) => r.status), options.strict);
}

export const describeMerge = `strobe merge <summary.json | shard directory | sweep part …> [--out FILE] [--strict]
  Joins the results of sharded runs.
  Check shards: give their summaries (DIR/catalogue.shard-i-of-n.json) or their --out directories.
  The merged summary goes to --out (default results/catalogue.json) and the complete records, each
  with its sweeps rebuilt from the sweep parts of every shard, to the models/ folder beside it: the
  result of one whole run. Refuses summaries from different engine versions and models that appear
  in two shards.
  Sweep shards (strobe sweep --shard): give the part files; the sweep goes to --out (default
  <sweep name>.json), identical to what one whole run writes. Refuses parts of different sweeps,
  models or engines, and reports missing points.
  Exit status 1 when a merged model is disputed, invalid or failed (--strict: also unsettled), or
  when the parts do not fit together; 2 on a usage error.`;

export async function runMerge(argv: string[], io: CliIO): Promise<number> {
  const args: string[] = [];
  let out: string | undefined;
  let strict = false;
  for (let i = 0; i < argv.length; i++) {
    if (argv[i] === '--out') {
      const v = argv[++i];
      if (!v) {
        io.stderr.write('strobe merge: --out needs a file name\n');
        return 2;
      }
      out = v;
    } else if (argv[i] === '--strict') strict = true;
    else if (argv[i].startsWith('--')) {
      io.stderr.write(`strobe merge: unknown option ${argv[i]}; see "strobe help merge"\n`);
      return 2;
    } else args.push(argv[i]);
  }
  if (args.length === 0) {
    io.stderr.write(`strobe merge: give the shard summaries, shard directories or sweep parts to merge\n${describeMerge}\n`);
    return 2;
  }
  const parts: { source: string; summary: CatalogueSummary }[] = [];
  const sweepParts: { source: string; part: SweepPart }[] = [];
  for (const arg of args) {
    const files = existsSync(arg) && statSync(arg).isDirectory() ? readdirSync(arg).filter((f) => /^catalogue\.shard-\d+-of-\d+\.json$/.test(f)).sort().map((f) => join(arg, f)) : [arg];
    if (files.length === 0) {
      io.stderr.write(`${arg}: no shard summary (catalogue.shard-i-of-n.json) in this directory\n`);
      return 1;
    }
    for (const file of files) {
      let value: unknown;
      try {
        value = JSON.parse(readFileSync(file, 'utf8'));
      } catch (e) {
        io.stderr.write(`${file}: cannot read a catalogue summary or sweep part: ${(e as Error).message}\n`);
        return 1;
      }
      if (isSweepPart(value)) {
        sweepParts.push({ source: file, part: value });
        continue;
      }
      const problems = reportProblems(value);
      if (problems.length > 0 || (value as { models?: unknown }).models === undefined) {
        io.stderr.write(`${file}: not a catalogue summary (${problems[0] ?? 'no models list'})\n`);
        return 1;
      }
      parts.push({ source: file, summary: value as CatalogueSummary });
    }
  }
  if (parts.length > 0 && sweepParts.length > 0) {
    io.stderr.write('strobe merge: give either check shards (summaries or directories) or the parts of one sweep, not both\n');
    return 2;
  }
  try {
    if (sweepParts.length > 0) {
      const merged = mergeSweepParts(sweepParts);
      const file = out ?? `${merged.name}.json`;
      writeFileEnsuringDir(file, canonicalJson(merged));
      io.stdout.write(`${merged.points.length} point(s) of sweep ${merged.name} from ${sweepParts.length} part(s) written to ${file}\n`);
      return merged.points.some((p) => p.error) ? 1 : 0;
    }
    const file = out ?? join('results', 'catalogue.json');
    const merged = mergeSummaries(parts);
    const dirs = parts.map((p) => dirname(p.source));
    const shardSweeps = readSweepParts(dirs);
    const records = completeRecords(merged.models.map((m) => m.id), dirs, shardSweeps);
    for (const record of records) writeRecordFile(dirname(file), record);
    writeFileEnsuringDir(file, canonicalJson(merged));
    io.stdout.write(`${count(merged.models.length, 'model')} from ${count(parts.length, 'shard')} written to ${file}${shardSweeps.length > 0 ? `, with the sweeps of ${count(shardSweeps.length, 'sweep part')}` : ''}\n`);
    return exitCodeFor(merged.models.map((m) => m.status), strict);
  } catch (e) {
    if (e instanceof MergeError || e instanceof SweepMergeError) {
      io.stderr.write(`strobe merge: ${e.message}\n`);
      return 1;
    }
    throw e;
  }
}
