import { loadModels } from './src/catalogue/load.ts';
import { formatDiagnostic } from './src/catalogue/diagnostics.ts';
const r = await loadModels(process.argv.slice(2));
for (const m of r.models) { console.log('OK', m.id, JSON.stringify(m.parameters)); for (const w of m.warnings) console.log(formatDiagnostic(w)); }
for (const f of r.failures) for (const d of f.diagnostics) console.log(formatDiagnostic(d));
