/**
 * The verification commands (inspect, sweep, merge) as entries of the command
 * table. Their logic lives in inspect.ts, sweep.ts and verify-summary.ts, which
 * write to stream-shaped outputs; this file only adapts them.
 */
import { asStreams, EXIT_OK, type Command, type CommandIO } from '../command.ts';
import * as inspect from './inspect.ts';
import * as sweep from './sweep.ts';
import { describeMerge, runMerge } from './verify-summary.ts';

function streamCommand(
  name: string,
  summary: string,
  describe: string,
  run: (argv: string[], io: ReturnType<typeof asStreams>) => Promise<number>,
): Command {
  const [usage, ...rest] = describe.split('\n');
  return {
    name,
    summary,
    usage,
    help: rest.map((line) => line.replace(/^ {2}/, '')).join('\n'),
    async run(args: string[], io: CommandIO) {
      if (args.includes('--help')) {
        io.stdout(`usage: ${usage}\n\n${rest.map((line) => line.replace(/^ {2}/, '')).join('\n')}\n`);
        return EXIT_OK;
      }
      return run(args, asStreams(io));
    },
  };
}

export const inspectCommand = streamCommand('inspect', 'verify one model and print its gaps, invariants and certificates', inspect.describe, inspect.run);
export const sweepCommand = streamCommand('sweep', 'map invariants over a grid of one or two parameters (a phase diagram)', sweep.describe, sweep.run);
export const mergeCommand = streamCommand('merge', 'join the summaries of sharded check runs into one', describeMerge, runMerge);
