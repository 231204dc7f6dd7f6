// Criteria of simple designs; reference values from numpy/scipy (tests/reference/evaluate/generate.py)
// and textbook facts named beside each check.
import { describe, expect, it } from 'vitest';
import fixture from '../../reference/evaluate/evaluate.json' with { type: 'json' };
import { compileModel } from '../../../src/core/model/modelMatrix.js';
import { assessDesignQuality } from '../../../src/core/evaluate/designQuality.js';
import { cubeMoments } from '../../../src/core/evaluate/cubeMoments.js';
import type { CandidateRegion } from '../../../src/core/region/candidateRegion.js';

const quadratic2 = compileModel(
  [{ powers: {} }, { powers: { a: 1 } }, { powers: { b: 1 } }, { powers: { a: 1, b: 1 } }, { powers: { a: 2 } }, { powers: { b: 2 } }],
  ['a', 'b'],
);
const quadraticLabels = ['1', 'a', 'b', 'a*b', 'a^2', 'b^2'];

function cube(k: number): number[][] {
  const points: number[][] = [];
  for (let code = 0; code < 2 ** k; code++) points.push(Array.from({ length: k }, (_, j) => ((code >> j) & 1 ? 1 : -1)));
  return points;
}

describe('cubeMoments', () => {
  it('matches the Gauss–Legendre quadrature of numpy for the quadratic model in two factors', () => {
    const W = cubeMoments(quadratic2);
    fixture.grid3x3Quadratic.moments.forEach((value, i) => expect(W[i]).toBeCloseTo(value, 12));
  });
});

describe('assessDesignQuality: orthogonal two-level designs', () => {
  const factors = ['x1', 'x2', 'x3'];
  const firstOrder = compileModel([{ powers: {} }, { powers: { x1: 1 } }, { powers: { x2: 1 } }, { powers: { x3: 1 } }], factors);
  const evaluation = assessDesignQuality(firstOrder, cube(3), { moments: cubeMoments(firstOrder), termLabels: ['1', 'x1', 'x2', 'x3'] });

  it('gives D-efficiency 100 % and VIF 1 (Myers, Montgomery & Anderson-Cook 2016, §8.2; Montgomery, Peck & Vining 2012, §9.4)', () => {
    expect(evaluation.fitsModel).toBe(true);
    expect(evaluation.dEfficiency).toBeCloseTo(100, 10);
    expect(evaluation.maxVif).toBeCloseTo(1, 12);
    for (const term of evaluation.terms.slice(1)) expect(term.vif).toBeCloseTo(1, 12);
  });

  it('gives coefficient variance 1/N, A-criterion 1/8 and G-efficiency 100 % (X\'X = 8 I)', () => {
    for (const term of evaluation.terms) expect(term.standardError).toBeCloseTo(Math.sqrt(1 / 8), 12);
    expect(evaluation.aCriterion).toBeCloseTo(1 / 8, 12);
    // Max of f'(X'X)⁻¹f over the cube is at a vertex: (1 + 3)/8, so G = 100·4/(8·0.5) = 100.
    expect(evaluation.gEfficiency).toBeCloseTo(100, 8);
    // Average prediction variance: (1 + 3·1/3)/8 = 0.25 (cube moments E[x²] = 1/3).
    expect(evaluation.iCriterion).toBeCloseTo(0.25, 12);
  });
});

describe('assessDesignQuality: 3^2 grid, quadratic model (numpy/scipy fixture)', () => {
  const ref = fixture.grid3x3Quadratic;
  const region: CandidateRegion = {
    factorIds: ['a', 'b'],
    levels: [[-1, 0, 1], [-1, 0, 1]],
    isFeasible: () => true,
    gridSize: 9,
    points: ref.points,
  };
  const evaluation = assessDesignQuality(quadratic2, ref.points, { moments: cubeMoments(quadratic2), termLabels: quadraticLabels, region });

  it('D-, A- and I-criteria', () => {
    expect(evaluation.dEfficiency).toBeCloseTo(ref.dEfficiency, 9);
    expect(evaluation.aCriterion).toBeCloseTo(ref.aCriterion, 12);
    expect(evaluation.iCriterion).toBeCloseTo(ref.iCriterion, 12);
    expect(evaluation.logDetPerRun).toBeCloseTo(6 * Math.log(ref.dEfficiency / 100), 9);
  });

  it('standard errors, VIF and power of every term (δ = 2, α = 0.05, 3 residual df)', () => {
    expect(evaluation.residualDf).toBe(3);
    evaluation.terms.forEach((term, j) => {
      expect(term.standardError).toBeCloseTo(ref.standardErrors[j], 12);
      if (j === 0) {
        expect(term.power).toBeNull();
      } else {
        expect(term.vif).toBeCloseTo(ref.vif[j - 1], 10);
        expect(term.power).toBeCloseTo(ref.power[j] as number, 6);
      }
    });
    expect(evaluation.minPower).toBeCloseTo(Math.min(...(ref.power.slice(1) as number[])), 6);
  });

  it('G-efficiency over the enumerated candidates', () => {
    expect(evaluation.gEfficiency).toBeCloseTo(ref.gEfficiencyOnGrid, 9);
    expect(evaluation.gEfficiencyNote).toMatch(/9 candidate points/);
  });
});

describe('assessDesignQuality: 2^3 factorial + 3 centre runs, two-factor-interaction model (numpy fixture)', () => {
  it('D-efficiency and residual df', () => {
    const factors = ['a', 'b', 'c'];
    const model = compileModel(
      [{ powers: {} }, { powers: { a: 1 } }, { powers: { b: 1 } }, { powers: { c: 1 } }, { powers: { a: 1, b: 1 } }, { powers: { a: 1, c: 1 } }, { powers: { b: 1, c: 1 } }],
      factors,
    );
    const points = [...cube(3), [0, 0, 0], [0, 0, 0], [0, 0, 0]];
    const evaluation = assessDesignQuality(model, points, { moments: cubeMoments(model), termLabels: ['1', 'a', 'b', 'c', 'a*b', 'a*c', 'b*c'] });
    expect(evaluation.dEfficiency).toBeCloseTo(fixture.factorial2cubedCentre3.dEfficiency, 9);
    expect(evaluation.residualDf).toBe(fixture.factorial2cubedCentre3.residualDf);
    expect(evaluation.minPower).toBeCloseTo(fixture.factorial2cubedCentre3.mainEffectPower, 6);
  });
});

describe('assessDesignQuality: edge cases', () => {
  it('a saturated design (N = p) has null power with a reason', () => {
    const model = compileModel([{ powers: {} }, { powers: { a: 1 } }, { powers: { b: 1 } }], ['a', 'b']);
    const evaluation = assessDesignQuality(model, [[-1, -1], [1, -1], [-1, 1]], { moments: cubeMoments(model), termLabels: ['1', 'a', 'b'] });
    expect(evaluation.fitsModel).toBe(true);
    expect(evaluation.residualDf).toBe(0);
    expect(evaluation.minPower).toBeNull();
    expect(evaluation.terms[1].power).toBeNull();
    expect(evaluation.powerNote).toMatch(/no residual degrees of freedom/);
  });

  it('a design that cannot fit the model returns null criteria and the missing terms', () => {
    const evaluation = assessDesignQuality(quadratic2, cube(2), { moments: cubeMoments(quadratic2), termLabels: quadraticLabels });
    expect(evaluation.fitsModel).toBe(false);
    expect(evaluation.dEfficiency).toBeNull();
    expect(evaluation.fds).toBeNull();
    expect(evaluation.nonEstimable.map((t) => t.term)).toEqual(['a^2', 'b^2']);
  });
});

describe('assessDesignQuality: power of linear and cubic terms of one factor (scipy fixture)', () => {
  // tests/reference/evaluate/generate.py, case 5: four evenly spaced levels twice + 3 centre
  // runs, model 1, x, x², x³; scipy.stats.nct power with β = δσ/range (x, x³: range 2; x²: 1).
  // The fixture shows why a cubic term reads weak even on a plan that spreads its levels
  // evenly: x and x³ overlap (VIF 12.7), so each coefficient alone is imprecise.
  const cubic = compileModel([{ powers: {} }, { powers: { x: 1 } }, { powers: { x: 2 } }, { powers: { x: 3 } }], ['x']);
  const evaluation = assessDesignQuality(cubic, fixture.cubic1FourLevels.points, {
    moments: cubeMoments(cubic),
    termLabels: ['1', 'x', 'x^2', 'x^3'],
  });

  it('standard errors, VIFs and powers per term agree with numpy/scipy', () => {
    expect(evaluation.residualDf).toBe(fixture.cubic1FourLevels.residualDf);
    fixture.cubic1FourLevels.terms.forEach((reference, j) => {
      const term = evaluation.terms[j];
      expect(term.term).toBe(reference.term);
      expect(term.standardError).toBeCloseTo(reference.standardError, 10);
      if (reference.vif === null) expect(term.vif).toBeNull();
      else expect(term.vif!).toBeCloseTo(reference.vif, 8);
      if (reference.power === null) expect(term.power).toBeNull();
      else expect(term.power!).toBeCloseTo(reference.power, 6);
    });
    expect(evaluation.minPower!).toBeCloseTo(fixture.cubic1FourLevels.terms[3].power!, 6);
  });
});
