/** loadModels on awkward inputs: it reports, it never throws, and the other models still load. */
import { mkdtempSync, mkdirSync, writeFileSync, copyFileSync, openSync, ftruncateSync, closeSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkModelSource, firstInvalidUtf8, loadModels, MAX_FILE_BYTES } from '../../src/catalogue/load.ts';
import { generate } from '../../scripts/generate-model-types.mjs';

const validChain = 'test/fixtures/valid/minimal-chain.json';

function scratch(): string {
  return mkdtempSync(path.join(tmpdir(), 'strobe-load-'));
}

describe('loadModels', () => {
  it('refuses a 50 MB file without reading it, and still loads its neighbour', async () => {
    const dir = scratch();
    copyFileSync(validChain, path.join(dir, 'minimal-chain.json'));
    const big = path.join(dir, 'huge-model.json');
    const fd = openSync(big, 'w');
    ftruncateSync(fd, 50 * 1024 * 1024); // sparse: costs no disk space
    closeSync(fd);
    const report = await loadModels([dir]);
    expect(report.models.map((m) => m.id)).toEqual(['minimal-chain']);
    expect(report.failures).toHaveLength(1);
    expect(report.failures[0].diagnostics[0]).toMatchObject({ line: 1, column: 1, pointer: '', message: 'file is 50.0 MB; model files may be at most 5 MB', severity: 'error' });
    expect(MAX_FILE_BYTES).toBe(5 * 1024 * 1024);
  });

  it('reports the same id in two folders once, at the second file’s "id"', async () => {
    const a = scratch();
    const b = scratch();
    copyFileSync(validChain, path.join(a, 'minimal-chain.json'));
    copyFileSync(validChain, path.join(b, 'minimal-chain.json'));
    const report = await loadModels([a, b]);
    expect(report.models).toHaveLength(1);
    const d = report.failures[0].diagnostics[0];
    expect(d.message).toBe(`id "minimal-chain" is already used by ${report.models[0].file}`);
    expect(d.pointer).toBe('/id');
    const idLine = readFileSync(validChain, 'utf8').split('\n').findIndex((l) => l.includes('"id"')) + 1;
    expect(d.line).toBe(idLine);
  });

  it('reports a missing path and continues', async () => {
    const report = await loadModels(['test/fixtures/no-such-folder', validChain]);
    expect(report.models).toHaveLength(1);
    expect(report.failures[0].diagnostics[0].message).toBe('no such file or folder');
  });

  it('accepts a byte-order mark and CRLF line ends, and locates errors on CRLF files', () => {
    const text = readFileSync(validChain, 'utf8');
    expect(checkModelSource('minimal-chain.json', '\uFEFF' + text).model?.id).toBe('minimal-chain');
    const crlf = text.replace(/\n/g, '\r\n').replace('"dimension": 1', '"dimension": 7');
    const { diagnostics } = checkModelSource('minimal-chain.json', crlf);
    const line = crlf.split('\r\n').findIndex((l) => l.includes('"dimension": 7')) + 1;
    expect(diagnostics[0]).toMatchObject({ pointer: '/lattice/dimension', line, column: '    "dimension": '.length + 1 });
  });

  it('evaluates parameters in dependency order', () => {
    const { model } = checkModelSource('minimal-chain.json', readFileSync(validChain, 'utf8'));
    expect(model?.parameters).toEqual({ T: 1, J1: 1, J2: 2 });
  });

  it('warns about unused parameters without failing the model', () => {
    const doc = JSON.parse(readFileSync(validChain, 'utf8'));
    doc.parameters.spare = 3;
    const { model, diagnostics } = checkModelSource('minimal-chain.json', JSON.stringify(doc, null, 2));
    expect(model).toBeDefined();
    expect(diagnostics.map((d) => [d.severity, d.message])).toEqual([['warning', 'parameter "spare" is never used']]);
  });

  it('loads a left-handed basis with a located warning, not an error (the engine accounts for the orientation)', async () => {
    const file = 'test/fixtures/valid/left-handed-basis.json';
    const report = await loadModels([file]);
    expect(report.failures).toEqual([]);
    expect(report.models.map((m) => m.id)).toEqual(['left-handed-basis']);
    const text = readFileSync(file, 'utf8');
    // a₁ = ŷ, a₂ = x̂: a₁ × a₂ = 0·0 − 1·1 = −1. The warning points at the "vectors" value.
    const before = text.slice(0, text.indexOf('[', text.indexOf('"vectors"'))).split('\n');
    expect(report.models[0].warnings).toEqual([
      {
        file, line: before.length, column: before[before.length - 1].length + 1, pointer: '/lattice/vectors', severity: 'warning',
        message: 'left-handed basis (a₁, a₂): Chern and winding numbers are reported in the Cartesian orientation; edge counts are named by the lattice vectors, so their signs follow the table in docs/conventions.md',
        hint: 'a₁ × a₂ = -1 < 0; nothing to fix if intended, or swap a₁ and a₂ (with the offset components, edge names and sweep axes that refer to them) for a right-handed basis',
      },
    ]);
  });

  it('never throws on arbitrary bytes (seeded fuzz)', async () => {
    const dir = scratch();
    let seed = 12345;
    const next = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const base = readFileSync(validChain);
    for (let n = 0; n < 40; n++) {
      const bytes = Buffer.from(base);
      for (let k = 0; k < 5; k++) bytes[Math.floor(next() * bytes.length)] = Math.floor(next() * 256);
      writeFileSync(path.join(dir, `fuzz-${n}.json`), bytes);
    }
    mkdirSync(path.join(dir, 'nested.json'));
    const report = await loadModels([dir]);
    expect(report.models.length + report.failures.length).toBe(41);
    for (const f of report.failures) {
      for (const d of f.diagnostics) {
        expect(d.line).toBeGreaterThanOrEqual(1);
        expect(d.message).not.toMatch(/internal error/);
      }
    }
  });
});

describe('firstInvalidUtf8', () => {
  it.each([
    [[0x41, 0x42], -1],
    [[0xe2, 0x9c, 0x93], -1], // ✓ U+2713
    [[0x41, 0xff], 1],
    [[0xc0, 0x80], 0], // overlong encoding of U+0000 (RFC 3629 forbids it)
    [[0xed, 0xa0, 0x80], 0], // UTF-16 surrogate U+D800
    [[0xe2, 0x9c], 0], // truncated sequence
  ])('%j → %d', (bytes, expected) => expect(firstInvalidUtf8(Uint8Array.from(bytes))).toBe(expected));
});

describe('generated model types', () => {
  it('are up to date with the schema', async () => {
    expect(readFileSync('src/catalogue/model-types.generated.ts', 'utf8')).toBe(await generate());
  });
});
