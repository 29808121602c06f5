/**
 * strobe site [--serve] [--port N] [--host H] [--skip-check] [check options…] [paths…]
 *
 * The main job in one command: verify the catalogue (as `strobe check`, writing
 * the records to results/ or --out DIR), build the static site from the records
 * of that folder that match the inventory as it is now (Astro), and optionally
 * serve dist/ on 127.0.0.1. Disputed or unsettled models are still published —
 * the site exists to show verdicts — but models whose records are missing or
 * stale are left out and named, and invalid input and build failures are
 * reported and reflected in the exit status.
 *
 * The build writes into a temporary folder beside dist/ and replaces dist/ only
 * when it succeeds; stopping `strobe site` (Ctrl-C, SIGTERM) stops the build too,
 * and so does killing it outright (SIGKILL): the build child watches its parent.
 */
import { spawn } from 'node:child_process';
import { existsSync, readdirSync, renameSync, rmSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { EXIT_FAILED, EXIT_OK, EXIT_USAGE, asStreams, type Command, type CommandIO } from '../command.ts';
import { parseCheckOptions, runVerifiedCheck, UsageError } from './verify-summary.ts';
import { portProblem, serveStatic } from '../static-server.ts';
import { selectSiteRecords, selectionReport } from '../../catalogue/records/site-selection.ts';
import { processAlive } from '../../catalogue/records/write.ts';

const HELP = `Verifies the catalogue (like strobe check: writes results/), builds the static
site into dist/ from the results records, and with --serve serves it until
interrupted (Ctrl-C), printing the address. Models marked "draft": true (as
strobe new writes them) are verified but not published.

Only records that match the model files as they are now are published (each
record carries a hash of its file): a model whose file changed after it was
checked, or that was never checked into the results folder, is left out and
named, with the reason.

Options:
  --serve          serve dist/ after building (default address 127.0.0.1:4321); the port
                   is checked before the build
  --port N         port to serve on (0 picks a free one)
  --host ADDRESS   address to bind (default 127.0.0.1)
  --skip-check     build from the existing records without verifying again
  --out DIR        the results folder to verify into and build from (default results)
  paths…           the inventory (model files or folders; default models)
  other options    passed to the verification (see strobe help check)

The site is built into a temporary folder and replaces dist/ only when the
build succeeds.

Exit status: 0 when the site was built (and, with --serve, after the server
stops); 1 when verification found invalid or disputed models (the site is
still built), the results cannot be published, the port is taken or the build
failed; 2 for a usage error.`;

interface SiteOptions {
  serve: boolean;
  port: number;
  host: string;
  skipCheck: boolean;
  checkArgs: string[];
}

export function parseSiteOptions(args: string[]): SiteOptions | string {
  const options: SiteOptions = { serve: false, port: 4321, host: '127.0.0.1', skipCheck: false, checkArgs: [] };
  for (let i = 0; i < args.length; i++) {
    const arg = args[i];
    if (arg === '--serve') options.serve = true;
    else if (arg === '--skip-check') options.skipCheck = true;
    else if (arg === '--port' || arg === '--host') {
      const value = args[++i];
      if (value === undefined) return `${arg} needs a value`;
      if (arg === '--port') {
        const port = Number(value);
        if (!Number.isInteger(port) || port < 0 || port > 65535) return `--port takes a whole number from 0 to 65535, got "${value}"`;
        options.port = port;
      } else options.host = value;
    } else options.checkArgs.push(arg);
  }
  return options;
}

/**
 * Runs `astro build` into outDir in a child process. While it runs, SIGINT,
 * SIGTERM and SIGHUP to this process stop the child as well (a terminal's
 * Ctrl-C reaches both anyway; a `kill` of this process alone would otherwise
 * leave the build running), remove the half-built folder and exit.
 */
function runAstroBuild(cwd: string, outDir: string, env: NodeJS.ProcessEnv, io: CommandIO): Promise<number> {
  const astro = join(cwd, 'node_modules', 'astro', 'astro.js');
  return new Promise((resolvePromise) => {
    // The watchdog ends the build if this process is killed outright (build-watchdog.mjs).
    const watchdog = pathToFileURL(fileURLToPath(new URL('../build-watchdog.mjs', import.meta.url))).href;
    const child = spawn(process.execPath, ['--import', watchdog, astro, 'build', '--silent', '--outDir', outDir], {
      cwd,
      env: { ...process.env, ...env, STROBE_BUILD_PARENT: String(process.pid), STROBE_BUILD_FOLDER: outDir },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    const signals: NodeJS.Signals[] = ['SIGINT', 'SIGTERM', 'SIGHUP'];
    const stop = (signal: NodeJS.Signals) => {
      child.once('close', () => {
        rmSync(outDir, { recursive: true, force: true });
        process.exit(128 + (signal === 'SIGINT' ? 2 : signal === 'SIGHUP' ? 1 : 15));
      });
      child.kill('SIGTERM');
    };
    for (const s of signals) process.on(s, stop);
    let errorText = '';
    child.stdout.on('data', () => {});
    child.stderr.on('data', (chunk: Buffer) => {
      errorText += chunk.toString();
    });
    child.on('close', (code) => {
      for (const s of signals) process.off(s, stop);
      if (code !== 0) io.stderr(`strobe site: the site build failed:\n${errorText}\n`);
      resolvePromise(code ?? 1);
    });
  });
}

/** Replaces dist/ by a freshly built folder: dist/ is either the old site or the new one, never a mix. */
function replaceFolder(fresh: string, target: string): void {
  const old = `${target}.old-${process.pid}`;
  if (existsSync(target)) renameSync(target, old);
  try {
    renameSync(fresh, target);
  } catch (error) {
    if (existsSync(old)) renameSync(old, target);
    throw error;
  }
  rmSync(old, { recursive: true, force: true });
}

export const siteCommand: Command = {
  name: 'site',
  summary: 'verify the catalogue, build the site and optionally serve it',
  usage: 'strobe site [--serve] [--port N] [--host ADDRESS] [--skip-check] [check options…] [paths…]',
  help: HELP,
  async run(args: string[], io: CommandIO): Promise<number> {
    const options = parseSiteOptions(args);
    if (typeof options === 'string') {
      io.stderr(`strobe site: ${options}\nhint: strobe help site\n`);
      return EXIT_USAGE;
    }
    let check;
    try {
      check = parseCheckOptions(options.checkArgs);
    } catch (error) {
      if (!(error instanceof UsageError)) throw error;
      io.stderr(`strobe site: ${error.message}\nhint: strobe help site\n`);
      return EXIT_USAGE;
    }
    if (options.serve) {
      // A taken port is known now, not after minutes of verification and building.
      const problem = await portProblem(options.port, options.host);
      if (problem) {
        io.stderr(`strobe site: ${problem}\nhint: choose another with --port N (0 picks a free one), or stop what is using it\n`);
        return EXIT_FAILED;
      }
    }
    let status = EXIT_OK;
    if (!options.skipCheck) {
      const checkStatus = await runVerifiedCheck(options.checkArgs, asStreams(io));
      if (checkStatus === EXIT_USAGE) return EXIT_USAGE;
      if (checkStatus !== EXIT_OK) status = EXIT_FAILED;
    }
    const results = resolve(io.cwd, check.out);
    const inventory = (check.paths.length > 0 ? check.paths : ['models']).map((p) => resolve(io.cwd, p));
    const selection = selectSiteRecords(results, inventory);
    if (selection.problems.length > 0) {
      io.stderr(`strobe site: the results in ${check.out}/ cannot be published:\n${selection.problems.map((p) => `  ${p.message}`).join('\n')}\n`);
      return EXIT_FAILED;
    }
    const left = selectionReport(selection);
    if (left) io.stderr(`strobe site: ${left}`);
    if (selection.records.length === 0) {
      io.stderr(`strobe site: no record in ${check.out}/ matches the inventory; nothing to publish\nhint: run without --skip-check, or with the same paths and --out as strobe check\n`);
      return EXIT_FAILED;
    }
    io.stdout(`building the site from ${selection.records.length} record(s) in ${check.out}/…\n`);
    const dist = join(io.cwd, 'dist');
    const temporary = join(io.cwd, `.dist-building-${process.pid}`);
    // Half-built folders of runs that did not live to clean up (killed with SIGKILL).
    for (const name of readdirSync(io.cwd)) {
      const m = /^\.dist-building-(\d+)$/.exec(name);
      if (m && (Number(m[1]) === process.pid || !processAlive(Number(m[1])))) rmSync(join(io.cwd, name), { recursive: true, force: true });
    }
    try {
      const code = await runAstroBuild(io.cwd, temporary, { STROBE_RESULTS: results, STROBE_INVENTORY: JSON.stringify(inventory) }, io);
      if (code !== 0) return EXIT_FAILED;
      replaceFolder(temporary, dist);
    } finally {
      rmSync(temporary, { recursive: true, force: true });
    }
    io.stdout(`site built in ${dist}\n`);
    if (!options.serve) return status;
    let server;
    try {
      server = await serveStatic(dist, options.port, options.host);
    } catch (error) {
      io.stderr(`strobe site: cannot serve on ${options.host}:${options.port}: ${(error as Error).message}\nhint: choose another with --port N (0 picks a free one)\n`);
      return EXIT_FAILED;
    }
    io.stdout(`Strobe Atlas is served at ${server.url} (Ctrl-C stops it)\n`);
    await new Promise<void>((resolveStop) => {
      const stop = () => {
        void server.close().then(resolveStop);
      };
      process.once('SIGINT', stop);
      process.once('SIGTERM', stop);
    });
    return status;
  },
};
