/**
 * `strobe check`: validate every model file, recompute every claim and write the
 * results records (verification lives in verify-summary.ts and the catalogue);
 * with --validate-only, stop after validation and print one line per model.
 */
import path from 'node:path';
import { loadModels } from '../../catalogue/load.ts';
import { formatDiagnostic } from '../../catalogue/diagnostics.ts';
import { asStreams, EXIT_FAILED, EXIT_OK, EXIT_USAGE, parseFlags, type Command } from '../command.ts';
import { describeCheckOptions, runVerifiedCheck } from './verify-summary.ts';

export const checkCommand: Command = {
  name: 'check',
  summary: 'validate model files and verify every claim (verdicts with certificates)',
  usage: 'strobe check [paths…] [options]  |  strobe check --validate-only [--json] [paths…]',
  help: `Validates model files, recomputes every claim and writes results records
(results/models/<id>.json, results/catalogue.json) for the site. Prints progress,
a summary table and, for each model that is not verified, what differs and why.

${describeCheckOptions}

With --validate-only the claims are not recomputed; one line per model:
  ✓ id  file                                        the model is valid
  ✗ file:line:column  pointer  message  (hint)      one line per error
    warning: file:line:column  pointer  message    one line per warning (the model still loads)

Arguments:
  paths…     model files or folders (folders are scanned for *.json); default: models

Options (with --validate-only):
  --json     print a machine-readable validation report instead of text
  --help     show this help

Exit codes (with --validate-only): 0 all models valid, 1 at least one invalid, 2 usage error.

Examples:
  strobe check
  strobe check --strict --junit results/junit.xml
  strobe check --validate-only models/qwz-sheet.json
  strobe check --validate-only --json models > report.json`,
  async run(args, io) {
    if (args.includes('--help')) {
      io.stdout(`usage: ${this.usage}\n\n${this.help}\n`);
      return EXIT_OK;
    }
    if (!args.includes('--validate-only')) return runVerifiedCheck(args, asStreams(io));
    const { flags, positionals, unknown } = parseFlags(args, ['--json', '--help', '--validate-only']);
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
        // Errors carry the ✗; warnings of the same file are listed under them, marked as warnings.
        for (const d of failure.diagnostics.filter((x) => x.severity === 'error')) io.stdout(`✗ ${formatDiagnostic(d)}\n`);
        for (const d of failure.diagnostics.filter((x) => x.severity === 'warning')) io.stdout(`  ${formatDiagnostic(d)}\n`);
      }
      const noun = checked === 1 ? 'model' : 'models';
      io.stdout(`${checked} ${noun} checked: ${report.models.length} valid, ${report.failures.length} invalid\n`);
    }
    return report.failures.length === 0 ? EXIT_OK : EXIT_FAILED;
  },
};
