/**
 * Every broken file in test/fixtures/invalid/ must fail with the expected
 * diagnostic. Expected positions are not pasted in: each case names an anchor
 * (a unique piece of the file's text) and the test finds its line:column by
 * scanning the file itself, so a wrong position in the loader cannot hide.
 */
import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadModels } from '../../src/catalogue/load.ts';

const dir = 'test/fixtures/invalid';

interface Case {
  /** Expected JSON pointer. */
  pointer: string;
  /** Exact message text. */
  message: string;
  /** Unique text in the file where the diagnostic must point (omit for 1:1); `shift` moves into it. */
  anchor?: string;
  shift?: number;
  hint?: string;
}

const cases: Record<string, Case> = {
  'amplitude-half-polar': { pointer: '/drive/segments/0/hoppings/0/amplitude', anchor: '{\n              "magnitude"', message: 'missing property "phase"', hint: 'phase: Phase in radians' },
  'bad-date': { pointer: '/dates/created', anchor: '"2024-13-01"', message: '"2024-13-01" is not a valid date', hint: 'write dates as YYYY-MM-DD, e.g. 2024-03-15' },
  'builtin-parameter-name': { pointer: '/parameters/pi', anchor: '"pi"', message: '"pi" is a built-in constant and cannot be a parameter name', hint: 'rename the parameter' },
  'chiral-not-unitary': { pointer: '/claims/symmetries/chiral/operator', anchor: '[\n          [\n            1', message: 'the chiral operator is not unitary: max |(M M†)ij − δij| = 3.00e+0 > 1e-9', hint: 'check signs and normalisation (entries like 1/sqrt(2))' },
  'chiral-wrong-size': { pointer: '/claims/symmetries/chiral/operator', anchor: '[\n          [\n            1', message: 'the chiral operator is 3×3 but the basis has 2 states', hint: 'give a 2×2 matrix' },
  comment: { pointer: '', anchor: '// the title', message: 'comments are not allowed in JSON', hint: 'put remarks into a "note" field' },
  'constructor-call': { pointer: '/drive/segments/0/hoppings/0/amplitude', anchor: '"constructor(1)"', shift: 1, message: 'unknown function "constructor"' },
  'dimension-three': { pointer: '/lattice/dimension', anchor: '3,\n    "vectors"', message: 'expected one of 1, 2; found 3' },
  'division-by-zero': { pointer: '/parameters/J2', anchor: '/(T-1)', shift: 0, message: 'division by zero' },
  'duplicate-key': { pointer: '/title', anchor: '"title": "Another title"', message: 'duplicate property "title"', hint: 'it is already set at line 5:3; keep one' },
  'duplicate-orbital': { pointer: '/lattice/orbitals/1/name', anchor: '"A",\n        "position": [\n          0.5', message: 'orbital name "A" is already used by orbital 0', hint: 'orbital names must be unique within the cell' },
  'durations-sum': { pointer: '/drive/segments', anchor: '[\n      {\n        "duration"', message: 'segment durations sum to 0.9 but the period is 1 (tolerance 1e-9·T)' },
  empty: { pointer: '', message: 'file is empty', hint: 'run "strobe new <id>" for a minimal model to start from' },
  'folder-named': { pointer: '', message: 'is a folder, not a model file' },
  // The hard lower limit of the gap tolerance (docs/model-format.md, policy.ts GAP_TOLERANCE_LIMIT).
  'gap-tolerance-below-limit': { pointer: '/numerics/tolerances/gap', anchor: '0.000001', message: 'must be ≥ 0.00001; found 0.000001' },
  'gap-label-range': { pointer: '/claims/gaps/0/quasienergy', anchor: '2,\n        "invariant"', message: 'gap label 2 is outside (−1, 1] (units of π/T)' },
  'id-mismatch': { pointer: '/id', anchor: '"some-other-model"', message: 'id "some-other-model" does not match the file name "id-mismatch.json"', hint: 'rename the file to some-other-model.json or set "id": "id-mismatch"' },
  'id-not-kebab': { pointer: '/id', anchor: '"Id_Not_Kebab"', message: '"Id_Not_Kebab" is not in the expected form', hint: 'Kebab-case identifier equal to the file name without .json' },
  'member-access': { pointer: '/parameters/J2', anchor: '.constructor', message: 'unexpected "."' },
  'missing-comma': { pointer: '', anchor: '"id"', message: 'expected "," between entries' },
  'missing-format-version': { pointer: '', message: 'missing property "formatVersion"', hint: 'formatVersion: Version of the model file format' },
  'missing-lattice': { pointer: '', message: 'missing property "lattice"', hint: 'lattice: Bravais lattice and the orbitals of one unit cell' },
  'modulation-kind': { pointer: '/drive/segments/0/hoppings/0/modulation/kind', anchor: '"square"', message: 'expected one of "constant", "harmonic"; found "square"' },
  'negative-duration': { pointer: '/drive/segments/0/duration', anchor: '-0.5', message: 'duration must be ≥ 0; found -0.5' },
  'nested-too-deep': { pointer: '/parameters/J2', anchor: '('.repeat(70), shift: 64, message: 'expression nested deeper than 64 levels' },
  'not-utf8': { pointer: '', anchor: '\uFFFD', message: 'file is not valid UTF-8 (byte 0xff at offset 112)', hint: 'save the file as UTF-8' },
  'offset-length': { pointer: '/drive/segments/0/hoppings/0/offset', anchor: '[\n              0,\n              1\n            ]', message: 'offset has 2 components; a 1D lattice needs 1' },
  'parallel-vectors': { pointer: '/lattice/vectors', anchor: '[\n      [\n        1,\n        0', message: 'lattice vectors a1 and a2 are parallel (a1 × a2 = 0)' },
  'parameter-cycle': { pointer: '/parameters/J1', anchor: '"J2/2"', message: 'cycle: J1 → J2 → J1', hint: 'give one of these parameters a number' },
  'period-wrong-type': { pointer: '/drive/period', anchor: 'true', message: 'expected a number or an expression string; found true' },
  'power-overflow': { pointer: '/parameters/J2', anchor: '"10^10^10"', shift: 3, message: '10^10000000000 is not a finite real number' },
  'proto-name': { pointer: '/drive/segments/0/hoppings/0/amplitude', anchor: '__proto__', message: 'unknown parameter "__proto__"', hint: 'parameters are T, J1, J2' },
  'self-hopping': { pointer: '/drive/segments/0/hoppings/0', anchor: '{\n            "from": "A",\n            "to": "A"', message: 'hopping from "A" to itself in the same cell' },
  'sweep-unknown-parameter': { pointer: '/sweeps/0/axes/0/parameter', anchor: '"J",', message: 'no parameter "J" to sweep' },
  'too-many-orbitals': { pointer: '/lattice/orbitals', anchor: '[\n      {\n        "name": "s0"', message: 'has 65 entries; at most 64 are supported' },
  'top-level-list': { pointer: '', message: 'a model file holds one JSON object; found a list' },
  'trailing-comma': { pointer: '', anchor: '}', message: 'expected a property name in double quotes', hint: 'remove a trailing comma or quote the name' },
  'unknown-function': { pointer: '/parameters/J2', anchor: 'sqr(', message: 'unknown function "sqr"' },
  'unknown-orbital': { pointer: '/drive/segments/1/hoppings/0/to', anchor: '"C"', message: 'no orbital "C"; orbitals are A, B' },
  'unknown-parameter': { pointer: '/drive/segments/1/hoppings/0/amplitude', anchor: 'J3', message: 'unknown parameter "J3"', hint: "did you mean 'J1'?" },
  'unknown-property': { pointer: '/drive/segments/0/hopings', anchor: '"hopings"', message: 'unknown property "hopings"', hint: "did you mean 'hoppings'?" },
  'winding-in-chain': { pointer: '/claims/gaps/0/winding', anchor: '"winding"', message: '"winding" applies to 2D sheets, not to this 1D model', hint: 'use "invariant" and "endModes" for chains' },
};

/** 1-based line:column of the first occurrence of `anchor` (after any earlier text it must follow). */
function positionOf(text: string, anchor: string | undefined, shift = 0): { line: number; column: number } {
  if (anchor === undefined) return { line: 1, column: 1 };
  // The trailing-comma case points at the closing brace that follows the comma.
  const start = anchor === '}' ? text.indexOf('",\n  },') + 5 : text.indexOf(anchor);
  expect(start, `anchor ${JSON.stringify(anchor)} not found`).toBeGreaterThanOrEqual(0);
  const before = text.slice(0, start + shift).split('\n');
  return { line: before.length, column: before[before.length - 1].length + 1 };
}

describe('invalid model files', async () => {
  const report = await loadModels([dir]);

  it('holds at least 30 distinct broken files, each with an expectation', () => {
    const names = readdirSync(dir).filter((f) => f.endsWith('.json')).map((f) => path.basename(f, '.json'));
    expect(names.length).toBeGreaterThanOrEqual(30);
    expect(names.sort()).toEqual(Object.keys(cases).sort());
  });

  it('loads none of them and still reports every one', () => {
    expect(report.models).toEqual([]);
    expect(report.failures).toHaveLength(Object.keys(cases).length);
  });

  it.each(Object.entries(cases))('%s', (name, expected) => {
    const file = `${dir}/${name}.json`;
    const failure = report.failures.find((f) => f.file === file);
    expect(failure, `no failure for ${file}`).toBeDefined();
    const first = failure!.diagnostics.find((d) => d.severity === 'error')!;
    let text = '';
    try {
      text = readFileSync(file, 'utf8');
    } catch {
      // folder-named.json is a folder
    }
    const at = positionOf(text, expected.anchor, expected.shift);
    expect({ pointer: first.pointer, message: first.message, line: first.line, column: first.column, file: first.file }).toEqual({
      pointer: expected.pointer,
      message: expected.message,
      line: at.line,
      column: at.column,
      file,
    });
    if (expected.hint !== undefined) expect(first.hint).toBe(expected.hint);
  });
});
