/**
 * The constraint language of the study file: a comparison over factor ids in engineering
 * units that a design point must satisfy (`feed_rate <= 0.2 * inlet_temp - 18`), read and
 * evaluated with mathjs — `and`, `or`, `not`, chained comparisons such as
 * `8 <= feed_rate <= 14` and mathjs functions like `sqrt` work (mathjs documentation,
 * "Expression syntax").
 *
 * Conventions fixed here:
 * - each expression is parsed and compiled once; names are checked at compile time: an
 *   operating factor id, a constant or a mathjs function; a model parameter is refused with
 *   its own message (it is not a setting), anything else with the nearest known id;
 * - the words the language gives a meaning of its own are the one list in
 *   constraintWords.ts; a constraint may use the constants among them;
 * - comparisons use mathjs' default relative tolerance (1e-12), so a grid point exactly on a
 *   boundary is not lost to binary noise;
 * - an expression must yield true or false; anything else is an InputError.
 * Every error is an InputError with key `constraints[i]`.
 */
import * as math from 'mathjs';
import type { EvalFunction, MathNode } from 'mathjs';
import { InputError } from '../inputError.js';
import { didYouMean } from '../suggestKey.js';
import { RESERVED_WORDS } from './constraintWords.js';

/** One compiled constraint: its text, its place in the study's list and the compiled expression. */
export interface Constraint {
  text: string;
  index: number;
  expression: EvalFunction;
}

/**
 * Parses and checks constraint `index` of the study. `operatingIds` are the names it may use
 * (operating factors, fixed ones included); `modelParameterIds` are refused by name.
 */
export function compileConstraint(
  text: string,
  index: number,
  operatingIds: readonly string[],
  modelParameterIds: ReadonlySet<string>,
): Constraint {
  const key = `constraints[${index}]`;
  let node: MathNode;
  try {
    node = math.parse(text);
  } catch (error) {
    throw new InputError(`cannot read constraint "${text}": ${(error as Error).message}`, { key });
  }
  node.traverse((n, path, parent) => {
    if (n.type === 'AssignmentNode' || n.type === 'FunctionAssignmentNode') {
      throw new InputError(`constraint "${text}" assigns a value; compare with ==, <= or >= instead of =`, { key });
    }
    if (n.type !== 'SymbolNode') return;
    const name = (n as math.SymbolNode).name;
    if (parent && parent.type === 'FunctionNode' && path === 'fn') {
      if (typeof (math as unknown as Record<string, unknown>)[name] !== 'function') {
        throw new InputError(`constraint "${text}" calls an unknown function ${name}`, { key });
      }
      return;
    }
    if (operatingIds.includes(name) || RESERVED_WORDS.has(name)) return;
    if (modelParameterIds.has(name)) {
      throw new InputError(
        `constraint "${text}" uses ${name}, a model parameter; constraints may only use operating settings`,
        { key },
      );
    }
    throw new InputError(`constraint "${text}" uses an unknown name "${name}"${didYouMean(name, operatingIds)}`, { key });
  });
  return { text, index, expression: node.compile() };
}

/** Whether the constraint holds for the settings in `scope` (factor id → engineering value). */
export function constraintHolds(constraint: Constraint, scope: Map<string, unknown>): boolean {
  const { text, index } = constraint;
  let result: unknown;
  try {
    result = constraint.expression.evaluate(scope);
  } catch (error) {
    if (error instanceof InputError) throw error;
    throw new InputError(`cannot evaluate constraint "${text}": ${(error as Error).message}`, { key: `constraints[${index}]` });
  }
  if (typeof result !== 'boolean') {
    throw new InputError(
      `constraint "${text}" does not yield true or false (got ${math.format(result as never, { precision: 6 })}); ` +
        'write a comparison such as a <= b',
      { key: `constraints[${index}]` },
    );
  }
  return result;
}
