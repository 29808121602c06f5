/**
 * Model documents of any size, for the work-budget calibration (bench) and the
 * corpus of limit-sized files (scripts/generate-hostile-fixtures.mts).
 *
 * Sheets are stacks of Qi–Wu–Zhang copies (Qi, Wu, Zhang, PRB 74, 085308
 * (2006)) with masses spread over (0.4, 1.6), so every copy is in its |C| = 1
 * phase and the stack keeps open gaps, coupled weakly to their neighbours so
 * that the Bloch matrix does not split into blocks; each segment of the period
 * repeats the Hamiltonian (duration T/segments), optionally with a harmonic
 * modulation of the couplings. Chains are stacks of dimer chains, each in the
 * two-step drive of models/two-step-chain.json.
 */

export interface SheetSpec {
  id?: string;
  /** Orbitals per cell (even: two per copy). */
  orbitals: number;
  segments?: number;
  /** Harmonic modulation of the couplings in every segment. */
  driven?: boolean;
  numerics?: Record<string, unknown>;
  sweeps?: unknown[];
  claims?: Record<string, unknown>;
  description?: string;
}

export interface ChainSpec {
  id?: string;
  orbitals: number;
  numerics?: Record<string, unknown>;
  sweeps?: unknown[];
  claims?: Record<string, unknown>;
}

function provenance(id: string, title: string) {
  return {
    $schema: '../../../schemas/model.schema.json',
    formatVersion: 1,
    id,
    title,
    summary: 'Generated model for work-budget and limit tests.',
    maintainers: ['Ines Varga (Lantern Lab, Ostvik University)'],
    dates: { created: '2024-06-01' },
  };
}

export function sheetDocument(spec: SheetSpec): Record<string, unknown> {
  const copies = Math.max(1, Math.floor(spec.orbitals / 2));
  const segments = spec.segments ?? 1;
  const orbitals = Array.from({ length: 2 * copies }, (_, i) => ({ name: `${i % 2 === 0 ? 'a' : 'b'}${Math.floor(i / 2)}`, position: [0, 0] }));
  const onsite: Record<string, unknown>[] = [];
  const hoppings: Record<string, unknown>[] = [];
  for (let c = 0; c < copies; c++) {
    const mass = Number((0.4 + (1.2 * (c + 0.5)) / copies).toFixed(6));
    const a = `a${c}`, b = `b${c}`;
    onsite.push({ orbital: a, energy: mass }, { orbital: b, energy: -mass });
    hoppings.push(
      { from: a, to: a, offset: [1, 0], amplitude: 0.5 },
      { from: b, to: b, offset: [1, 0], amplitude: -0.5 },
      { from: a, to: a, offset: [0, 1], amplitude: 0.5 },
      { from: b, to: b, offset: [0, 1], amplitude: -0.5 },
      { from: a, to: b, offset: [1, 0], amplitude: { re: 0, im: 0.5 } },
      { from: a, to: b, offset: [-1, 0], amplitude: { re: 0, im: -0.5 } },
      { from: a, to: b, offset: [0, 1], amplitude: 0.5 },
      { from: a, to: b, offset: [0, -1], amplitude: -0.5 },
    );
    if (c + 1 < copies) {
      const coupling: Record<string, unknown> = { from: a, to: `a${c + 1}`, offset: [0, 0], amplitude: 0.05 };
      if (spec.driven) coupling.modulation = { kind: 'harmonic', mean: 1, components: [{ amplitude: 0.5, harmonic: 1, function: 'cos' }] };
      hoppings.push(coupling);
    }
  }
  if (spec.driven && copies === 1) hoppings[0] = { ...hoppings[0], modulation: { kind: 'harmonic', mean: 1, components: [{ amplitude: 0.2, harmonic: 1, function: 'cos' }] } };
  const id = spec.id ?? `sheet-${2 * copies}-orbitals-${segments}-segments`;
  return {
    ...provenance(id, `Stack of ${copies} coupled Qi–Wu–Zhang copies`),
    ...(spec.description !== undefined ? { description: spec.description } : {}),
    lattice: { dimension: 2, vectors: [[1, 0], [0, 1]], orbitals },
    parameters: { T: 0.5 },
    drive: {
      period: 'T',
      segments: Array.from({ length: segments }, (_, s) => ({ label: `repeat ${s + 1}`, duration: `T/${segments}`, onsite, hoppings })),
    },
    claims: spec.claims ?? {},
    ...(spec.numerics ? { numerics: spec.numerics } : {}),
    ...(spec.sweeps ? { sweeps: spec.sweeps } : {}),
  };
}

export function chainDocument(spec: ChainSpec): Record<string, unknown> {
  const copies = Math.max(1, Math.floor(spec.orbitals / 2));
  const orbitals = Array.from({ length: 2 * copies }, (_, i) => ({ name: `${i % 2 === 0 ? 'a' : 'b'}${Math.floor(i / 2)}`, position: [i % 2 === 0 ? 0 : 0.5] }));
  const first: Record<string, unknown>[] = [];
  const second: Record<string, unknown>[] = [];
  for (let c = 0; c < copies; c++) {
    first.push({ from: `a${c}`, to: `b${c}`, offset: [0], amplitude: Number((0.7 * Math.PI + 0.01 * c).toFixed(6)) });
    second.push({ from: `b${c}`, to: `a${c}`, offset: [1], amplitude: Number((1.7 * Math.PI - 0.01 * c).toFixed(6)) });
    if (c + 1 < copies) second.push({ from: `a${c}`, to: `b${c + 1}`, offset: [0], amplitude: 0.05 });
  }
  const id = spec.id ?? `chain-${2 * copies}-orbitals`;
  return {
    ...provenance(id, `Stack of ${copies} driven dimer chains`),
    lattice: { dimension: 1, vectors: [[1]], orbitals },
    parameters: { T: 1 },
    drive: {
      period: 'T',
      segments: [
        { label: 'intracell bonds', duration: 'T/2', hoppings: first },
        { label: 'intercell bonds', duration: 'T/2', hoppings: second },
      ],
    },
    claims: spec.claims ?? {},
    ...(spec.numerics ? { numerics: spec.numerics } : {}),
    ...(spec.sweeps ? { sweeps: spec.sweeps } : {}),
  };
}
