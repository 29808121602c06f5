/** `strobe new <id>`: write a minimal valid model to start from. */
import { mkdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { EXIT_FAILED, EXIT_OK, EXIT_USAGE, parseFlags, type Command } from '../command.ts';

const ID = /^[a-z0-9]+(-[a-z0-9]+)*$/;

/** A static one-orbital chain: the smallest model that passes every check. */
export function minimalModel(id: string, today: string): string {
  const model = {
    $schema: '../schemas/model.schema.json',
    formatVersion: 1,
    id,
    title: id,
    summary: 'One-orbital chain with nearest-neighbour hopping; replace with your model.',
    description: 'Describe the model here. TeX math works: $H(k) = 2t\\cos k$.',
    tags: ['draft'],
    draft: true,
    maintainers: ['Your Name (Your Group)'],
    references: [],
    dates: { created: today },
    lattice: { dimension: 1, vectors: [[1]], orbitals: [{ name: 'A', position: [0] }] },
    parameters: { T: { value: 1, description: 'period' }, t: { value: 1, description: 'hopping' } },
    drive: {
      period: 'T',
      segments: [{ label: 'static', duration: 'T', hoppings: [{ from: 'A', to: 'A', offset: [1], amplitude: 't' }] }],
    },
    claims: {},
  };
  return JSON.stringify(model, null, 2) + '\n';
}

export const newCommand: Command = {
  name: 'new',
  summary: 'create models/<id>.json from a minimal valid model',
  usage: 'strobe new [--dir folder] <id>',
  help: `Writes a minimal valid model (a static one-orbital chain) to models/<id>.json.
Refuses to overwrite an existing file. The file is marked "draft": true: strobe
check verifies it like any model, but the site leaves it out until you remove
that line.

Arguments:
  id           kebab-case identifier: lower-case letters and digits, single hyphens (e.g. driven-ladder)

Options:
  --dir folder write into this folder instead of models
  --help       show this help

Exit codes: 0 written, 1 file exists or cannot be written, 2 usage error (missing or malformed id).`,
  async run(args, io) {
    let dir = 'models';
    const rest: string[] = [];
    for (let i = 0; i < args.length; i++) {
      if (args[i] === '--dir') {
        if (i + 1 >= args.length) {
          io.stderr('strobe new: --dir needs a folder\n');
          return EXIT_USAGE;
        }
        dir = args[++i];
      } else rest.push(args[i]);
    }
    const { flags, positionals, unknown } = parseFlags(rest, ['--help']);
    if (unknown) {
      io.stderr(`strobe new: unknown option ${unknown}\nhint: run "strobe help new" for the options\n`);
      return EXIT_USAGE;
    }
    if (flags.has('--help')) {
      io.stdout(`usage: ${this.usage}\n\n${this.help}\n`);
      return EXIT_OK;
    }
    if (positionals.length !== 1) {
      io.stderr(`strobe new: expected exactly one id, got ${positionals.length}\nusage: ${this.usage}\n`);
      return EXIT_USAGE;
    }
    const id = positionals[0];
    if (!ID.test(id) || id.length > 64) {
      const suggestion = id.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '');
      io.stderr(`strobe new: "${id}" is not a valid id\nhint: use kebab-case (lower-case letters, digits, single hyphens, at most 64 characters)${suggestion && ID.test(suggestion) ? `, e.g. ${suggestion}` : ''}\n`);
      return EXIT_USAGE;
    }
    const folder = path.resolve(io.cwd, dir);
    const file = path.join(folder, `${id}.json`);
    const today = new Date().toISOString().slice(0, 10);
    try {
      await mkdir(folder, { recursive: true });
      await writeFile(file, minimalModel(id, today), { flag: 'wx' });
    } catch (error) {
      const code = (error as NodeJS.ErrnoException).code;
      if (code === 'EEXIST') {
        io.stderr(`strobe new: ${path.relative(io.cwd, file)} already exists; not overwriting\nhint: pick another id or edit the existing file\n`);
      } else io.stderr(`strobe new: cannot write ${path.relative(io.cwd, file)}: ${code ?? (error as Error).message}\n`);
      return EXIT_FAILED;
    }
    io.stdout(`wrote ${path.relative(io.cwd, file)} (a draft: not published on the site until you remove "draft": true)\nnext: edit it, then run "strobe check ${path.relative(io.cwd, file)}"\n`);
    return EXIT_OK;
  },
};
