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
 * - an expression must yield true or false; anything else is an InputError;
 * - the parsed expression is a sandbox: only numbers, true/false, names, parentheses, the
 *   arithmetic, comparison and logic operators in ALLOWED_OPERATORS and calls of the functions
 *   in CONSTRAINT_FUNCTIONS pass. Assignments, function definitions, property access,
 *   matrices, objects, ranges, strings, units and every other mathjs function (`evaluate`,
 *   `parse`, `simplify`, `import`, …) are refused before anything is evaluated;
 * - nesting deeper than the expressionDepth limit is refused, before parsing for brackets.
 * Every error is an InputError with key `constraints[i]`.
 */
import * as math from 'mathjs';
import type { EvalFunction, MathNode } from 'mathjs';
import { InputError } from '../inputError.js';
import { didYouMean } from '../suggestKey.js';
import { aboveLimit, limitOf } from '../inputLimits.js';
import { CONSTRAINT_FUNCTIONS, RESERVED_WORDS } from './constraintWords.js';

/** mathjs operator functions a constraint may use: arithmetic, comparisons and logic. */
const ALLOWED_OPERATORS: ReadonlySet<string> = new Set([
  'add', 'subtract', 'multiply', 'divide', 'pow', 'mod', 'unaryMinus', 'unaryPlus',
  'equal', 'unequal', 'smaller', 'smallerEq', 'larger', 'largerEq',
  'and', 'or', 'xor', 'not',
]);

/** Node types that may appear at all; each is checked further below. */
const ALLOWED_NODES: ReadonlySet<string> = new Set([
  'ConstantNode', 'SymbolNode', 'ParenthesisNode', 'OperatorNode', 'RelationalNode', 'FunctionNode',
]);

/** What a refused node is, in the user's words. */
const REFUSED_NODES: Readonly<Record<string, string>> = {
  AssignmentNode: 'assigns a value; compare with ==, <= or >= instead of =',
  FunctionAssignmentNode: 'defines a function; constraints can only compare settings',
  AccessorNode: 'accesses a property or an element; constraints can only use factor ids and numbers',
  IndexNode: 'accesses a property or an element; constraints can only use factor ids and numbers',
  ArrayNode: 'contains a matrix or list; constraints can only compare numbers',
  ObjectNode: 'contains an object; constraints can only compare numbers',
  RangeNode: 'contains a range; constraints can only compare numbers',
  BlockNode: 'holds several statements; write one comparison per constraint',
  ConditionalNode: 'uses ?: ; write the condition with and, or, not instead',
};

/** Deepest bracket nesting of the text, outside quotes (a cheap guard before the parser recurses). */
function bracketDepth(text: string): number {
  let depth = 0;
  let deepest = 0;
  for (const character of text) {
    if (character === '(' || character === '[' || character === '{') deepest = Math.max(deepest, ++depth);
    else if (character === ')' || character === ']' || character === '}') depth = Math.max(0, depth - 1);
  }
  return deepest;
}

/** The called name as the message puts it: a mathjs function we do not allow, or an unknown one. */
function calledWhat(name: string | null): string {
  if (name === null) return 'something that is not a function name';
  if (typeof (math as unknown as Record<string, unknown>)[name] === 'function') return `${name}, which constraints do not allow`;
  return `an unknown function ${name}`;
}

function nodeDepth(node: MathNode): number {
  let deepest = 0;
  node.forEach((child) => {
    deepest = Math.max(deepest, nodeDepth(child));
  });
  return deepest + 1;
}

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
  const depthLimit = limitOf('expressionDepth');
  const brackets = bracketDepth(text);
  if (brackets > depthLimit) {
    throw new InputError(`constraint nests brackets ${brackets} levels deep, ${aboveLimit('expressionDepth')}`, { key });
  }
  let node: MathNode;
  try {
    node = math.parse(text);
  } catch (error) {
    throw new InputError(`cannot read constraint "${text}": ${(error as Error).message}`, { key });
  }
  const depth = nodeDepth(node);
  if (depth > depthLimit) throw new InputError(`constraint nests ${depth} levels deep, ${aboveLimit('expressionDepth')}`, { key });
  node.traverse((n, path, parent) => {
    const refused = REFUSED_NODES[n.type];
    if (refused) throw new InputError(`constraint "${text}" ${refused}`, { key });
    if (!ALLOWED_NODES.has(n.type)) throw new InputError(`constraint "${text}" contains a ${n.type}, which constraints do not allow`, { key });
    if (n.type === 'ConstantNode') {
      const value = (n as math.ConstantNode).value as unknown;
      if (typeof value !== 'number' && typeof value !== 'boolean') {
        throw new InputError(`constraint "${text}" contains ${typeof value === 'string' ? 'a string' : `the literal ${String(value)}`}; constraints can only compare numbers`, { key });
      }
      return;
    }
    if (n.type === 'OperatorNode') {
      const operator = n as math.OperatorNode;
      if (!ALLOWED_OPERATORS.has(operator.fn)) {
        throw new InputError(`constraint "${text}" uses the operator ${operator.op}, which constraints do not allow (arithmetic, comparisons, and, or, not)`, { key });
      }
      return;
    }
    if (n.type === 'FunctionNode') {
      const call = n as math.FunctionNode;
      const name = call.fn.type === 'SymbolNode' ? (call.fn as unknown as math.SymbolNode).name : null;
      if (name === null || !CONSTRAINT_FUNCTIONS.has(name)) {
        throw new InputError(
          `constraint "${text}" calls ${calledWhat(name)}; allowed: ${[...CONSTRAINT_FUNCTIONS].join(', ')}`,
          { key },
        );
      }
      return;
    }
    if (n.type !== 'SymbolNode') return;
    const name = (n as math.SymbolNode).name;
    if (parent && parent.type === 'FunctionNode' && path === 'fn') return;
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
