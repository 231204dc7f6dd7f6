import { describe, expect, it } from 'vitest';
import { parseTerm } from '../../../src/core/model/termSyntax.js';
import { termLabel } from '../../../src/core/model/modelTerm.js';
import { expectInputError } from '../../support/expectInputError.js';

const ids = ['inlet_temp', 'feed_solids', 'feed_rate', 'atomiser_speed', 'air_flow'];

describe('parseTerm', () => {
  it('reads main effects, powers and products', () => {
    expect(parseTerm('inlet_temp', ids)).toEqual({ inlet_temp: 1 });
    expect(parseTerm('inlet_temp^2', ids)).toEqual({ inlet_temp: 2 });
    expect(parseTerm(' inlet_temp * feed_rate ', ids)).toEqual({ inlet_temp: 1, feed_rate: 1 });
    expect(parseTerm('feed_solids^2*atomiser_speed', ids)).toEqual({ feed_solids: 2, atomiser_speed: 1 });
    expect(parseTerm('inlet_temp ^ 3', ids)).toEqual({ inlet_temp: 3 });
  });

  it('reads 1 as the intercept and a repeated factor as a power', () => {
    expect(parseTerm('1', ids)).toEqual({});
    expect(parseTerm('feed_rate*feed_rate', ids)).toEqual({ feed_rate: 2 });
  });

  it('round-trips with the written form of modelTerm.ts', () => {
    for (const text of ['inlet_temp', 'inlet_temp^2', 'inlet_temp*feed_rate', 'feed_solids^2*atomiser_speed']) {
      expect(termLabel({ powers: parseTerm(text, ids) }, ids)).toBe(text);
    }
    // Factors are written in factor-list order whatever order the user used.
    expect(termLabel({ powers: parseTerm('feed_rate*inlet_temp', ids) }, ids)).toBe('inlet_temp*feed_rate');
  });

  it('names an unknown factor with a did-you-mean suggestion and the key', () => {
    const e = expectInputError(() => parseTerm('inlet_tmp*feed_rate', ids, 'design.model[3]'));
    expect(e.location.key).toBe('design.model[3]');
    expect(e.message).toContain('unknown factor "inlet_tmp"');
    expect(e.message).toContain('did you mean `inlet_temp`?');
    const far = expectInputError(() => parseTerm('viscosity', ids, 'design.model[0]'));
    expect(far.message).toContain('expected one of inlet_temp, feed_solids');
  });

  it('reports syntax errors with the key', () => {
    for (const bad of ['', 'inlet_temp**2', 'inlet_temp^', 'inlet_temp^0', 'inlet_temp^1.5', 'log(feed_rate)', 'inlet_temp+feed_rate', '*feed_rate', 'inlet_temp^-1']) {
      const e = expectInputError(() => parseTerm(bad, ids, 'design.model[1]'));
      expect(e.location.key).toBe('design.model[1]');
    }
  });
});
