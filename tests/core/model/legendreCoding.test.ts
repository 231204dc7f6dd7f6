// Legendre coding against numpy.polynomial.legendre and numpy.linalg (tests/reference/precision/generate.py).
import { describe, expect, it } from 'vitest';
import fixture from '../../reference/precision/precision.json' with { type: 'json' };
import { legendre, legendreLabel } from '../../../src/core/model/legendreCoding.js';
import { compileModel } from '../../../src/core/model/modelMatrix.js';
import { orthogonalTermTable } from '../../../src/core/precision/orthogonalTermTable.js';
import { leastSquaresCovariance } from '../../../src/core/precision/designPrecision.js';

const cubic = compileModel([{ powers: {} }, { powers: { x: 1 } }, { powers: { x: 2 } }, { powers: { x: 3 } }], ['x']);
const labels = ['1', 'x', 'x^2', 'x^3'];
const points = fixture.legendre.points.map((x) => [x]);

describe('Legendre polynomials', () => {
  it('P3 at the five levels equals numpy.polynomial.legendre.legval', () => {
    for (const [x, value] of Object.entries(fixture.legendre.p3At)) expect(legendre(3, Number(x))).toBeCloseTo(value, 14);
  });
  it('P2 = (3x² − 1)/2 (Abramowitz & Stegun 22.3.8)', () => {
    expect(legendre(2, 0.3)).toBeCloseTo((3 * 0.09 - 1) / 2, 15);
    expect(legendreLabel(cubic, 2)).toBe('P2(x)');
  });
});

describe('term table in Legendre coding: a 5-level cubic, 7 runs (numpy fixture)', () => {
  it('standard errors and variance inflation equal numpy’s in both codings', () => {
    const table = orthogonalTermTable(cubic, labels, points)!;
    table.forEach((row, t) => expect(row.standardError).toBeCloseTo(fixture.legendre.seLegendre[t], 10));
    table.slice(1).forEach((row, t) => expect(row.overlap!).toBeCloseTo(fixture.legendre.vifLegendre[t], 8));
    const { covariance } = leastSquaresCovariance(cubic, points);
    labels.forEach((_, t) => expect(Math.sqrt(covariance![t * 4 + t])).toBeCloseTo(fixture.legendre.seRaw[t], 10));
  });

  it('the linear term overlaps far less in Legendre coding than in raw powers', () => {
    // numpy: VIF 16.1 for raw x against 2.81 for P1 on this design.
    expect(fixture.legendre.vifRaw[0]).toBeGreaterThan(16);
    expect(orthogonalTermTable(cubic, labels, points)![1].overlap!).toBeLessThan(fixture.legendre.vifRaw[0] / 5);
  });

  it('the top-order term’s test is the same in raw and Legendre coding (same noncentrality for 0.3x + 0.4x³)', () => {
    const table = orthogonalTermTable(cubic, labels, points)!;
    const { covariance } = leastSquaresCovariance(cubic, points);
    const raw = 0.4 / Math.sqrt(covariance![15]);
    const orthogonal = (0.4 * 2) / 5 / table[3].standardError; // x³ = (2P3 + 3P1)/5
    expect(raw).toBeCloseTo(fixture.legendre.topNoncentralityRaw, 10);
    expect(orthogonal).toBeCloseTo(fixture.legendre.topNoncentralityLegendre, 10);
    expect(orthogonal).toBeCloseTo(raw, 10);
  });
});
