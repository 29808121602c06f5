/** `strobe check`: validate model files and print one line per model. */
import path from 'node:path';
import { loadModels } from '../../catalogue/load.ts';
import { formatDiagnostic } from '../../catalogue/diagnostics.ts';
import { EXIT_FAILED, EXIT_OK, EXIT_USAGE, parseFlags, type Command } from '../command.ts';

export const checkCommand: Command = {
  name: 'check',
  summary: 'validate model files (schema, parameters, cross-field rules)',
  usage: 'strobe check [--json] [paths…]',
  help: `Validates model files and prints one line per model:
  ✓ id  file                                        the model is valid
  ✗ file:line:column  pointer  message  (hint)      one line per problem

Arguments:
  paths…     model files or folders (folders are scanned for *.json); default: models

Options:
  --json     print a machine-readable report instead of text
  --help     show this help

Exit codes: 0 all models valid, 1 at least one invalid, 2 usage error.

Examples:
  strobe check
  strobe check models/qwz-sheet.json
  strobe check --json models > report.json`,
  async run(args, io) {
    const { flags, positionals, unknown } = parseFlags(args, ['--json', '--help']);
    if (unknown) {
      io.stderr(`strobe check: unknown option ${unknown}\nhint: run "strobe help check" for the options\n`);
      return EXIT_USAGE;
    }
    if (flags.has('--help')) {
      io.stdout(`usage: ${this.usage}\n\n${this.help}\n`);
      return EXIT_OK;
    }
    const paths = (positionals.length > 0 ? positionals : ['models']).map((p) => path.resolve(io.cwd, p));
    const report = await loadModels(paths);
    const checked = report.models.length + report.failures.length;
    if (flags.has('--json')) {
      const json = {
        valid: report.failures.length === 0,
        summary: { checked, valid: report.models.length, invalid: report.failures.length },
        models: report.models.map((m) => ({ id: m.id, file: m.file, parameters: m.parameters, warnings: m.warnings })),
        failures: report.failures,
      };
      io.stdout(JSON.stringify(json, null, 2) + '\n');
    } else {
      for (const model of report.models) {
        io.stdout(`✓ ${model.id}  ${model.file}\n`);
        for (const w of model.warnings) io.stdout(`  ${formatDiagnostic(w)}\n`);
      }
      for (const failure of report.failures) {
        for (const d of failure.diagnostics) io.stdout(`✗ ${formatDiagnostic(d)}\n`);
      }
      const noun = checked === 1 ? 'model' : 'models';
      io.stdout(`${checked} ${noun} checked: ${report.models.length} valid, ${report.failures.length} invalid\n`);
    }
    return report.failures.length === 0 ? EXIT_OK : EXIT_FAILED;
  },
};
