/**
 * Writes the corpus of hostile and limit-sized model files in test/fixtures/hostile/
 * and the outcome each must have (expected.json), read by
 * test/catalogue/hostile-corpus.test.ts. Run with `npx tsx scripts/generate-hostile-fixtures.mts`;
 * the files are committed, so tests never run this.
 */
import { mkdirSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { chainDocument, sheetDocument } from '../test/support/synthetic-models.ts';

const dir = join(process.cwd(), 'test', 'fixtures', 'hostile');
mkdirSync(dir, { recursive: true });
for (const name of readdirSync(dir)) rmSync(join(dir, name));

interface Expected {
  /** Status of the record. */
  status: string;
  /** Incident kind for failed records. */
  incident?: string;
  /** Pointer of the first error diagnostic. */
  pointer?: string;
  /** Text the first error message contains. */
  message?: string;
}
const expected: Record<string, Expected> = {};
const write = (file: string, content: string | object, outcome: Expected) => {
  writeFileSync(join(dir, file), typeof content === 'string' ? content : JSON.stringify(content, null, 2) + '\n');
  expected[file] = outcome;
};
const refused = (pointer: string): Expected => ({ status: 'failed', incident: 'over-budget', pointer, message: 'not computed' });
const badDescription = (message: string): Expected => ({ status: 'invalid', pointer: '/description', message });
const chain = (id: string, extra: Record<string, unknown> = {}) => ({ ...chainDocument({ id, orbitals: 2, numerics: { chainLength: 12, kGrid: [32] } }), ...extra });

// File names that must not become unsafe record ids or page paths.
write('.json', chain('dot-name'), { status: 'invalid', pointer: '/id', message: 'does not match the file name ".json"' });
write('..json', chain('dots'), { status: 'invalid', pointer: '/id', message: 'does not match the file name' });
// Valid files at the format's limits: refused by the work estimate, never computed.
// 64 orbitals and 64 segments; each segment switches on a few bonds only, to keep the file small.
const wide = sheetDocument({ id: 'limit-orbitals-and-segments', orbitals: 64 }) as { drive: { segments: { hoppings: unknown[]; onsite: unknown[] }[] } };
const bonds = wide.drive.segments[0].hoppings;
wide.drive.segments = Array.from({ length: 64 }, (_, s) => ({ label: `step ${s + 1}`, duration: 'T/64', onsite: [], hoppings: bonds.slice((s * 8) % bonds.length, ((s * 8) % bonds.length) + 8) }));
write('limit-orbitals-and-segments.json', wide, refused('/lattice/orbitals'));
write('limit-open-chain.json', chainDocument({ id: 'limit-open-chain', orbitals: 2, numerics: { chainLength: 4000 } }), refused('/numerics/chainLength'));
write('limit-ribbon.json', sheetDocument({ id: 'limit-ribbon', orbitals: 2, numerics: { ribbon: { width: 2000, momenta: 4096 } } }), refused('/numerics/ribbon/width'));
write('limit-kgrid.json', sheetDocument({ id: 'limit-kgrid', orbitals: 2, numerics: { kGrid: [1024, 1024] } }), refused('/numerics/kGrid'));
const sweeps = chainDocument({
  id: 'limit-sweeps',
  orbitals: 2,
  sweeps: Array.from({ length: 16 }, (_, i) => ({ name: `sweep-${i}`, axes: [{ parameter: 'T', start: 0.5, stop: 1.5, count: 401 }, { parameter: 'J', start: 0.5, stop: 1.5, count: 401 }], quantities: ['invariant'] })),
});
(sweeps.parameters as Record<string, unknown>).J = 1;
write('limit-sweeps.json', sweeps, refused('/sweeps/0/axes/0/count'));
// Descriptions that once hung or crashed the site build.
const macro = 'x'.repeat(500);
write('description-macro.json', chain('description-macro', { description: `$\\def\\big{${macro}}${'\\big'.repeat(30)}$` }), badDescription('defines a macro'));
write('description-nested-quotes.json', chain('description-nested-quotes', { description: '>'.repeat(9000) + ' deep' }), badDescription('nests block quotes or lists too deeply'));
write('description-emphasis.json', chain('description-emphasis', { description: '*a'.repeat(4000) }), badDescription('delimiters'));
write('description-formulas.json', chain('description-formulas', { description: '$a$ '.repeat(2400) }), badDescription('more than 200 formulas'));
write('description-long.json', chain('description-long', { description: 'word '.repeat(2100) }), { status: 'invalid', pointer: '/description', message: 'longer than 10000 characters' });
// Script in every form Markdown allows: the model is fine, the script must stay inert (its page shows text).
write(
  'description-script.json',
  chain('description-script', {
    description: 'Hi <script>window.__injected = true</script> <img src=x onerror="window.__injected = true"> [link](javascript:window.__injected=true) $\\href{javascript:alert(1)}{x}$ $\\htmlClass{x}{y}$',
  }),
  { status: 'portrait-only' },
);
// Numbers and names at and past the limits.
write('time-limit-too-long.json', chain('time-limit-too-long', { numerics: { timeLimit: 86400 } }), { status: 'invalid', pointer: '/numerics/timeLimit', message: '≤ 3600' });
write('deep-json.json', '['.repeat(20000) + ']'.repeat(20000), { status: 'invalid', pointer: '', message: 'nest more than 100 levels deep' });
write('id-dot-dot.json', chain('..'), { status: 'invalid', pointer: '/id' });

writeFileSync(join(dir, '..', 'hostile-expected.json'), JSON.stringify(expected, null, 2) + '\n');
console.log(`wrote ${Object.keys(expected).length} files to ${dir}`);
