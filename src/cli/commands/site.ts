/**
 * strobe site [--serve] [--port N] [--host H] [--skip-check] [check options…]
 *
 * The main job in one command: verify the catalogue (as `strobe check`, writing
 * results/), build the static site from those records (Astro), and optionally
 * serve dist/ on 127.0.0.1. Disputed or unsettled models are still published —
 * the site exists to show verdicts — but invalid input and build failures are
 * reported and reflected in the exit status.
 */
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { EXIT_FAILED, EXIT_OK, EXIT_USAGE, type Command, type CommandIO } from '../command.ts';
import { runVerifiedCheck } from './verify-summary.ts';
import { serveStatic } from '../static-server.ts';

const HELP = `Verifies the catalogue (like strobe check: writes results/), builds the static
site into dist/ from the results records, and with --serve serves it until
interrupted (Ctrl-C), printing the address. Models marked "draft": true (as
strobe new writes them) are verified but not published.

Options:
  --serve          serve dist/ after building (default address 127.0.0.1:4321)
  --port N         port to serve on (0 picks a free one)
  --host ADDRESS   address to bind (default 127.0.0.1)
  --skip-check     build from the existing results/ without verifying again
  other options    passed to the verification (see strobe help check)

Exit status: 0 when the site was built (and, with --serve, after the server
stops); 1 when verification found invalid or disputed models (the site is
still built) or the build failed; 2 for a usage error.`;

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

function runAstroBuild(cwd: string, io: CommandIO): Promise<number> {
  const astro = join(cwd, 'node_modules', 'astro', 'astro.js');
  return new Promise((resolve) => {
    const child = spawn(process.execPath, [astro, 'build', '--silent'], { cwd, stdio: ['ignore', 'pipe', 'pipe'] });
    let errorText = '';
    child.stdout.on('data', () => {});
    child.stderr.on('data', (chunk: Buffer) => { errorText += chunk.toString(); });
    child.on('close', (code) => {
      if (code !== 0) io.stderr(`strobe site: the site build failed:\n${errorText}`);
      resolve(code ?? 1);
    });
  });
}

export const siteCommand: Command = {
  name: 'site',
  summary: 'verify the catalogue, build the site and optionally serve it',
  usage: 'strobe site [--serve] [--port N] [--host ADDRESS] [--skip-check] [check options…]',
  help: HELP,
  async run(args: string[], io: CommandIO): Promise<number> {
    const options = parseSiteOptions(args);
    if (typeof options === 'string') {
      io.stderr(`strobe site: ${options}\nhint: strobe help site\n`);
      return EXIT_USAGE;
    }
    let status = EXIT_OK;
    if (!options.skipCheck) {
      const checkStatus = await runVerifiedCheck(options.checkArgs, {
        stdout: { write: (text: string) => io.stdout(text), isTTY: process.stdout.isTTY },
        stderr: { write: (text: string) => io.stderr(text) },
      });
      if (checkStatus === EXIT_USAGE) return EXIT_USAGE;
      if (checkStatus !== EXIT_OK) status = EXIT_FAILED;
    }
    if (!existsSync(join(io.cwd, 'results', 'catalogue.json'))) {
      io.stderr('strobe site: no results/catalogue.json to build from\nhint: run without --skip-check\n');
      return EXIT_FAILED;
    }
    io.stdout('building the site…\n');
    if ((await runAstroBuild(io.cwd, io)) !== 0) return EXIT_FAILED;
    io.stdout(`site built in ${join(io.cwd, 'dist')}\n`);
    if (!options.serve) return status;
    const server = await serveStatic(join(io.cwd, 'dist'), options.port, options.host);
    io.stdout(`Strobe Atlas is served at ${server.url} (Ctrl-C stops it)\n`);
    await new Promise<void>((resolve) => {
      const stop = () => { void server.close().then(resolve); };
      process.once('SIGINT', stop);
      process.once('SIGTERM', stop);
    });
    return status;
  },
};
