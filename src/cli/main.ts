/**
 * Entry point of the `strobe` command (bin/strobe.mjs calls main). Commands are
 * looked up in a table; each lives in src/cli/commands/<name>.ts. Output goes
 * through injectable streams so tests can capture it.
 */
import { closestName } from '../catalogue/diagnostics.ts';
import { checkCommand } from './commands/check.ts';
import { helpCommand, overview } from './commands/help.ts';
import { newCommand } from './commands/new.ts';
import { inspectCommand, mergeCommand, sweepCommand } from './commands/verification-commands.ts';
import { siteCommand } from './commands/site.ts';
import { EXIT_OK, EXIT_USAGE, type Command, type CommandIO } from './command.ts';

export const commands: Command[] = [checkCommand, inspectCommand, sweepCommand, mergeCommand, siteCommand, newCommand];
commands.push(helpCommand(() => commands));

export async function main(argv: string[], io: Partial<CommandIO> = {}): Promise<number> {
  const streams: CommandIO = {
    stdout: io.stdout ?? ((text) => void process.stdout.write(text)),
    stderr: io.stderr ?? ((text) => void process.stderr.write(text)),
    cwd: io.cwd ?? process.cwd(),
    isTerminal: io.isTerminal ?? (io.stdout === undefined && process.stdout.isTTY === true),
  };
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h') {
    streams.stdout(overview(commands));
    return name === undefined ? EXIT_USAGE : EXIT_OK;
  }
  const command = commands.find((c) => c.name === name);
  if (!command) {
    const close = closestName(name, commands.map((c) => c.name));
    const hint = close ? `did you mean "strobe ${close}"?` : `commands are ${commands.map((c) => c.name).join(', ')}`;
    streams.stderr(`strobe: unknown command "${name}"\nhint: ${hint}\n`);
    return EXIT_USAGE;
  }
  try {
    return await command.run(rest, streams);
  } catch (error) {
    streams.stderr(`strobe ${name}: unexpected failure: ${(error as Error).message}\nThis is a bug; please report it with the command you ran.\n`);
    return 70;
  }
}
