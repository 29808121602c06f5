/** `strobe help [command]`: the command list, or one command's full help. */
import { EXIT_OK, EXIT_USAGE, type Command } from '../command.ts';

export function overview(commands: readonly Command[]): string {
  const width = Math.max(...commands.map((c) => c.name.length));
  const lines = commands.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`);
  return `strobe — check topological claims about periodically driven lattice models

usage: strobe <command> [options] [arguments]

commands:
${lines.join('\n')}

Run "strobe help <command>" or "strobe <command> --help" for details.
`;
}

export function helpCommand(commands: () => readonly Command[]): Command {
  return {
    name: 'help',
    summary: 'show help for strobe or one command',
    usage: 'strobe help [command]',
    help: 'Without an argument, lists the commands. With a command name, shows its usage, options and exit codes.',
    async run(args, io) {
      const all = commands();
      if (args.length === 0) {
        io.stdout(overview(all));
        return EXIT_OK;
      }
      const target = all.find((c) => c.name === args[0]);
      if (!target || args.length > 1) {
        io.stderr(`strobe help: no command "${args.join(' ')}"\nhint: commands are ${all.map((c) => c.name).join(', ')}\n`);
        return EXIT_USAGE;
      }
      io.stdout(`usage: ${target.usage}\n\n${target.help}\n`);
      return EXIT_OK;
    },
  };
}
