/**
 * The constraint language is a sandbox: anything but arithmetic, comparisons, logic, the
 * allowed functions and factor ids is refused by the parser, before evaluation, with one line
 * naming constraints[i]. Nesting past the expressionDepth limit is refused too.
 */
import { describe, expect, it } from 'vitest';
import { compileConstraint, constraintHolds } from '../../../src/core/region/constraintLanguage.js';
import { InputError } from '../../../src/core/inputError.js';

const IDS = ['temp', 'feed'];

function refusal(text: string): string {
  try {
    compileConstraint(text, 2, IDS, new Set(['k1']));
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    const described = (error as InputError).describe();
    expect(described).not.toContain('\n');
    expect(described.startsWith('key constraints[2]: ')).toBe(true);
    return described;
  }
  throw new Error(`"${text}" was accepted`);
}

describe('the constraint sandbox refuses', () => {
  it.each([
    ['an assignment', 'temp = 5', /assigns a value/],
    ['a function definition', 'f(x) = x^2', /defines a function/],
    ['unit creation', 'unit("5 cm") > temp', /calls unit, which constraints do not allow/],
    ['unit creation by createUnit', 'createUnit("furlong") > temp', /calls createUnit/],
    ['a unit written after a number', 'temp > 5 cm', /unknown name "cm"/],
    ['import', 'import({x: 1}) > temp', /calls (an unknown function )?import/],
    ['evaluate', 'evaluate("1+1") > temp', /calls evaluate/],
    ['parse', 'parse("temp") > temp', /calls parse/],
    ['simplify', 'simplify("temp") > temp', /calls simplify/],
    ['property access', 'temp.constructor > 1', /accesses a property/],
    ['element access', 'temp[1] > 1', /accesses a property or an element/],
    ['a matrix', '[1, 2] > temp', /contains a matrix/],
    ['a string', 'temp > "80"', /contains a string/],
    ['an object', '{a: 1} > temp', /contains an object/],
    ['a conversion operator', 'temp to cm > 1', /operator to/],
    ['several statements', 'temp > 1; feed > 1', /several statements/],
  ])('%s', (_, text, message) => {
    expect(refusal(text)).toMatch(message);
  });

  it(`nesting past 20 levels, before parsing`, () => {
    const nested = (depth: number) => `${'('.repeat(depth)}temp${')'.repeat(depth)} > 1`;
    expect(() => compileConstraint(nested(18), 0, IDS, new Set())).not.toThrow();
    expect(refusal(nested(21))).toBe('key constraints[2]: constraint nests brackets 21 levels deep, above the limit of 20 levels (see "Limits" in the README)');
    expect(refusal(`temp > ${'-'.repeat(40)}1`)).toMatch(/nests 4\d levels deep, above the limit of 20 levels/);
  });
});

describe('the constraint sandbox keeps', () => {
  it.each([
    ['arithmetic and a comparison', 'feed <= 0.2 * temp - 18', true],
    ['chained comparisons and logic', '100 <= temp <= 200 and not (feed > 30) or (true xor false)', true],
    ['the allowed functions', 'sqrt(abs(feed - temp)) + max(1, log(temp)) > 0', true],
    ['constants', 'temp < 100 * pi', true],
  ])('%s', (_, text, expected) => {
    const constraint = compileConstraint(text, 0, IDS, new Set());
    expect(constraintHolds(constraint, new Map([['temp', 150], ['feed', 10]]))).toBe(expected);
  });
});
