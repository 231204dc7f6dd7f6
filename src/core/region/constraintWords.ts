/**
 * The reserved words of the constraint language (constraintLanguage.ts): names mathjs gives a
 * meaning of its own — constants (`i` is the imaginary unit, so a comparison with it fails to
 * evaluate), literals and operator words (mathjs documentation, "Expression syntax").
 *
 * The one list: the study reader refuses these as factor and response ids, and a constraint
 * may use the constants among them. Kept apart from the language itself so that reading a
 * study does not load mathjs (the `tiers` command never parses a constraint).
 */
export const RESERVED_WORDS: ReadonlySet<string> = new Set([
  'e', 'E', 'pi', 'PI', 'i', 'tau', 'phi', 'Infinity', 'NaN', 'true', 'false', 'null', 'undefined',
  'and', 'or', 'not', 'xor', 'mod', 'to', 'in', 'end',
]);

/**
 * The functions a constraint may call (mathjs names). Anything else — `evaluate`, `parse`,
 * `simplify`, `import`, `unit`, `matrix` and the rest of mathjs — is refused by the parser.
 */
export const CONSTRAINT_FUNCTIONS: ReadonlySet<string> = new Set([
  'abs', 'sqrt', 'cbrt', 'exp', 'log', 'log10', 'log2', 'pow', 'min', 'max', 'round', 'floor', 'ceil', 'sign',
  'sin', 'cos', 'tan',
]);
