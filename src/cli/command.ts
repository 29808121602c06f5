/**
 * The shape every `strobe` command shares. main.ts dispatches through a table of
 * these, so adding a command means adding one file and one table entry.
 */
export interface CommandIO {
  stdout: (text: string) => void;
  stderr: (text: string) => void;
  /** Working directory that relative paths are resolved against. */
  cwd: string;
  /** True when stdout is an interactive terminal (progress lines are rewritten in place). */
  isTerminal?: boolean;
}

export interface Command {
  name: string;
  /** One line for the command list. */
  summary: string;
  /** Usage line(s), e.g. "strobe check [--json] [paths…]". */
  usage: string;
  /** Full help text: options, arguments, exit codes, examples. */
  help: string;
  run(args: string[], io: CommandIO): Promise<number>;
}

/** Exit codes shared by all commands. */
export const EXIT_OK = 0;
export const EXIT_FAILED = 1;
export const EXIT_USAGE = 2;

/** Splits arguments into known flags and positionals; reports the first unknown option. */
export function parseFlags(args: string[], known: readonly string[]): { flags: Set<string>; positionals: string[]; unknown?: string } {
  const flags = new Set<string>();
  const positionals: string[] = [];
  let onlyPositionals = false;
  for (const arg of args) {
    if (!onlyPositionals && arg === '--') onlyPositionals = true;
    else if (!onlyPositionals && arg.startsWith('-') && arg !== '-') {
      if (!known.includes(arg)) return { flags, positionals, unknown: arg };
      flags.add(arg);
    } else positionals.push(arg);
  }
  return { flags, positionals };
}

/** Stream-shaped view of CommandIO, for commands written against write() streams. */
export function asStreams(io: CommandIO): { stdout: { write(text: string): boolean; isTTY?: boolean }; stderr: { write(text: string): boolean } } {
  return {
    stdout: { write: (text: string) => (io.stdout(text), true), isTTY: io.isTerminal === true },
    stderr: { write: (text: string) => (io.stderr(text), true) },
  };
}
