/**
 * Banded Floquet operators of ribbons and open chains against the dense
 * integrator (propagator.ts, itself tested against scipy fixtures): exact for
 * step drives, within the stated truncation and time-integration bounds
 * otherwise; and the velocity bound against the actual motion of quasienergies.
 */
import { describe, expect, it } from 'vitest';
import { openBandedFloquet, prepareBandedFloquet, DENSE_SEGMENT_STATES } from '../../../src/numerics/evolution/banded-propagator.ts';
import { floquetOperator } from '../../../src/numerics/evolution/propagator.ts';
import { quasienergyVelocityBound } from '../../../src/numerics/evolution/velocity-bound.ts';
import { truncateDrive } from '../../../src/numerics/supercell.ts';
import { distance } from '../../../src/numerics/linalg/complex-matrix.ts';
import { UnitaryEigen } from '../../../src/numerics/linalg/unitary-eigen.ts';
import { checkerboardDrive } from '../../support/drives/checkerboard.ts';
import { circularHoneycombDrive, threeStepHoneycombDrive } from '../../support/drives/honeycomb.ts';
import { qwzDrive } from '../../support/drives/qwz.ts';
import { twoStepChain } from '../../support/drives/chains.ts';
import { expectBelow } from '../linalg/comparisons.ts';

describe('banded Floquet operators', () => {
  it('equal the dense product for step drives, exactly (every step splits into dimers)', () => {
    for (const drive of [threeStepHoneycombDrive({ hopping: 0.45 * Math.PI, stepDuration: 1, mass: 0.3 }), checkerboardDrive({ hopping: 0.4 * Math.PI, offset: 0.3, stepDuration: 1 })]) {
      const ribbon = truncateDrive(drive, 1, 20);
      const u = prepareBandedFloquet(ribbon).at([0.37]);
      expect(u.route).toBe('exact');
      expect(u.truncation).toBe(0);
      // A few cells' worth of states, whatever the width.
      expect(u.operator.b).toBeLessThanOrEqual(8);
      expectBelow('‖U_band − U_dense‖_F', distance(u.operator.toDense(), floquetOperator(ribbon, [0.37]).operator), 1e-13);
    }
    const chain = openBandedFloquet(twoStepChain(0.4 * Math.PI, 0.7 * Math.PI), 0, 30).at([]);
    expectBelow('open chain', distance(chain.operator.toDense(), floquetOperator(truncateDrive(twoStepChain(0.4 * Math.PI, 0.7 * Math.PI), 0, 30), []).operator), 1e-13);
  });

  it('stay within the stated truncation bound when a step does not split (Chebyshev route)', () => {
    // 40 cells: one connected block of 80 states, more than MAX_EXACT_BLOCK.
    const ribbon = truncateDrive(qwzDrive(1, 1.3), 0, 40);
    const u = prepareBandedFloquet(ribbon).at([0.21]);
    expect(u.route).toBe('expanded');
    // ‖·‖_F ≤ √n ‖·‖₂ for the comparison with the dense spectral exponential.
    expectBelow('‖U_band − U‖_F', distance(u.operator.withBandwidth(79).toDense(), floquetOperator(ribbon, [0.21]).operator), Math.sqrt(80) * u.truncation + 1e-12);
  });

  it('integrate time-dependent segments in band storage (CF4 slices) to within the accuracy of the dense integrator', () => {
    // Wide enough (more than DENSE_SEGMENT_STATES states) for the banded slices.
    const cells = Math.ceil(DENSE_SEGMENT_STATES / 2) + 4;
    const drive = circularHoneycombDrive({ hopping: 1, amplitude: 0.8, frequency: 8 });
    const ribbon = truncateDrive(drive, 1, cells);
    const options = { tolerance: 1e-6 };
    const banded = openBandedFloquet(drive, 1, cells, options).at([0.3]);
    const dense = floquetOperator(ribbon, [0.3], options);
    const n = 2 * cells;
    const bound = Math.sqrt(n) * (banded.truncation + banded.accuracy + dense.accuracy) + 1e-10;
    expectBelow('‖U_band − U_dense‖_F', distance(banded.operator.withBandwidth(n - 1).toDense(), dense.operator), bound);
  });
});

describe('quasienergy velocity bound', () => {
  it('bounds how far any quasienergy of a ribbon moves between neighbouring momenta', () => {
    const drive = threeStepHoneycombDrive({ hopping: 0.45 * Math.PI, stepDuration: 1, mass: 0.3 });
    const v = quasienergyVelocityBound(drive, 0);
    const ribbon = truncateDrive(drive, 1, 10);
    const band = prepareBandedFloquet(ribbon);
    const dk = 1e-3;
    let fastest = 0;
    for (let j = 0; j < 40; j++) {
      const k = (j + 0.5) / 40;
      const a = new UnitaryEigen(band.at([k]).operator.toDense()).phases, b = new UnitaryEigen(band.at([k + dk]).operator.toDense()).phases;
      // Sorted phases move by at most the matching distance (Bhatia–Davis), so sorted differences bound the velocity too.
      for (let c = 0; c < a.length; c++) fastest = Math.max(fastest, Math.abs(b[c] - a[c]) / Math.PI / dk);
    }
    expect(fastest).toBeGreaterThan(0.1 * v);
    expect(fastest).toBeLessThanOrEqual(v);
  });
});
