import jsep from 'jsep';
import { QUANTITY_INFO, quantitiesWithDimension, sameDimension, type Dimension, type Quantity } from './quantities';
import { parseReading } from './parse';
import { copperResistanceAt } from './verdict';

/**
 * Formulas over earlier readings, e.g. `parallel(secondaryOhms, capOhms)` or
 * `0.5 * storageFarads * chargePeakVolts ** 2`. jsep parses; this file walks the tree itself and
 * allows only numbers, quantities in quotes ("0.2 Ω"), step ids, + − × ÷ **, and the functions
 * below. No eval, no Function, no property access: nothing in a document can reach the runtime.
 */

export interface FormulaValue {
  readonly value: number;
  readonly quantity: Quantity;
}

export type FormulaErrorCode =
  | 'syntax'
  | 'not-allowed'
  | 'unknown-function'
  | 'wrong-arguments'
  | 'unknown-step'
  | 'unit-mismatch'
  | 'math'
  | 'too-long'
  | 'too-deep';

export interface FormulaError {
  readonly code: FormulaErrorCode;
  readonly message: string;
  /** 0-based character index in the expression, where known. */
  readonly position?: number;
}

export type FormulaResult =
  | { ok: true; value: number; dimension: Dimension; quantity: Quantity | null }
  | { ok: false; error: FormulaError };

interface Q {
  value: number;
  dim: Dimension;
}
const NONE: Dimension = [0, 0, 0, 0, 0, 0];

class FormulaFailure extends Error {
  constructor(readonly code: FormulaErrorCode, message: string, readonly position?: number) {
    super(message);
  }
}

function describe(dim: Dimension): string {
  const q = quantitiesWithDimension(dim)[0];
  if (q) return q === 'ratio' ? 'a plain number' : `a ${QUANTITY_INFO[q].label.replace(/^(DC|AC|peak) /, '')}`;
  const names = ['kg', 'm', 's', 'A', 'K', 'rev'];
  return `a value in ${dim.map((e, i) => (e ? `${names[i]}^${e}` : '')).filter(Boolean).join('·')}`;
}

function same(args: Q[], what: string): Dimension {
  const dim = args[0]!.dim;
  if (!args.every((a) => sameDimension(a.dim, dim))) {
    throw new FormulaFailure('unit-mismatch', `${what} needs values of one kind; it got ${args.map((a) => describe(a.dim)).join(' and ')}.`);
  }
  return dim;
}

function scale(dim: Dimension, k: number): Dimension {
  return dim.map((e) => e * k) as unknown as Dimension;
}
function combine(a: Dimension, b: Dimension, sign: 1 | -1): Dimension {
  return a.map((e, i) => e + sign * (b[i] ?? 0)) as unknown as Dimension;
}

type Fn = { arity: [number, number]; run: (args: Q[]) => Q };
const FUNCTIONS: Readonly<Record<string, Fn>> = {
  parallel: { arity: [2, 20], run: (a) => ({ dim: same(a, 'parallel()'), value: a.some((x) => x.value === 0) ? 0 : 1 / a.reduce((s, x) => s + 1 / x.value, 0) }) },
  series: { arity: [2, 20], run: (a) => ({ dim: same(a, 'series()'), value: a.reduce((s, x) => s + x.value, 0) }) },
  min: { arity: [1, 20], run: (a) => ({ dim: same(a, 'min()'), value: Math.min(...a.map((x) => x.value)) }) },
  max: { arity: [1, 20], run: (a) => ({ dim: same(a, 'max()'), value: Math.max(...a.map((x) => x.value)) }) },
  abs: { arity: [1, 1], run: ([x]) => ({ dim: x!.dim, value: Math.abs(x!.value) }) },
  sqrt: { arity: [1, 1], run: ([x]) => ({ dim: scale(x!.dim, 0.5), value: Math.sqrt(x!.value) }) },
  ratio: { arity: [2, 2], run: (a) => (same(a, 'ratio()'), { dim: NONE, value: a[0]!.value / a[1]!.value }) },
  /** E = ½CV² (capacitance, voltage) → energy. */
  energy: { arity: [2, 2], run: ([c, v]) => ({ dim: combine(c!.dim, scale(v!.dim, 2), 1), value: 0.5 * c!.value * v!.value ** 2 }) },
  /** IEC 60028 copper correction: copper(ohms, measuredAt °C, reference °C = 20). */
  copper: {
    arity: [2, 3],
    run: ([r, t, ref]) => {
      for (const x of [t, ref]) if (x && !sameDimension(x.dim, QUANTITY_INFO.temperature.dimension)) {
        throw new FormulaFailure('unit-mismatch', `copper() takes temperatures as its 2nd and 3rd arguments, not ${describe(x.dim)}.`);
      }
      return { dim: r!.dim, value: copperResistanceAt(r!.value, t!.value, ref?.value ?? 20) };
    },
  },
};

/** Names a formula may call, for the editor's help text. */
export const FORMULA_FUNCTIONS = Object.keys(FUNCTIONS);

function positionOf(text: string, token: string): number | undefined {
  const i = text.search(new RegExp(`(?<![A-Za-z0-9_])${token.replace(/[^A-Za-z0-9_]/g, '\\$&')}(?![A-Za-z0-9_])`));
  return i < 0 ? undefined : i;
}

function quantityLiteral(raw: string, text: string): Q {
  if (/^\s*[-+]?[\d.,]+\s*$/.test(raw)) {
    throw new FormulaFailure('not-allowed', `"${raw}" in quotes needs a unit, e.g. "0.2 Ω"; a plain number needs no quotes.`, positionOf(text, raw));
  }
  const found: Q[] = [];
  for (const q of Object.keys(QUANTITY_INFO) as Quantity[]) {
    const r = parseReading(raw, q);
    const dim = QUANTITY_INFO[q].dimension;
    if (r.ok && !found.some((f) => sameDimension(f.dim, dim))) found.push({ value: r.reading.value, dim });
  }
  if (found.length === 1) return found[0]!;
  const message = found.length > 1
    ? `"${raw}" could be more than one kind of value; name the unit, e.g. "4.7 kΩ" or "4.7 kV".`
    : `"${raw}" is not a value with a unit Sparkwright knows, e.g. "0.2 Ω" or "20 °C".`;
  throw new FormulaFailure('not-allowed', message, text.indexOf(raw));
}

type Lookup = (id: string) => Q;

/** A number as written: one too large for a double (or that rounds to zero) is refused, not used as ∞ or 0. */
function numberLiteral(v: number, raw: string, text: string): number {
  const shown = raw.length > 12 ? `${raw.slice(0, 12)}…` : raw;
  if (!Number.isFinite(v)) throw new FormulaFailure('math', `The number ${shown} is too large for a formula.`, text.indexOf(raw));
  if (v === 0 && /[1-9]/.test(raw.split(/e/i)[0]!)) throw new FormulaFailure('math', `The number ${shown} is too small for a formula.`, text.indexOf(raw));
  return v;
}

function evaluate(node: jsep.Expression, look: Lookup, text: string): Q {
  switch (node.type) {
    case 'Literal': {
      const v = (node as jsep.Literal).value;
      if (typeof v === 'number') return { value: numberLiteral(v, String((node as jsep.Literal).raw), text), dim: NONE };
      if (typeof v === 'string') return quantityLiteral(v, text);
      throw new FormulaFailure('not-allowed', `${String((node as jsep.Literal).raw)} is not allowed in a formula.`, positionOf(text, String(v)));
    }
    case 'Identifier':
      return look((node as jsep.Identifier).name);
    case 'UnaryExpression': {
      const u = node as jsep.UnaryExpression;
      const x = evaluate(u.argument, look, text);
      if (u.operator === '-') return { value: -x.value, dim: x.dim };
      if (u.operator === '+') return x;
      throw new FormulaFailure('not-allowed', `The operator ${u.operator} is not allowed; use + − * / ** and functions.`, text.indexOf(u.operator));
    }
    case 'BinaryExpression':
      return binary(node as jsep.BinaryExpression, look, text);
    case 'CallExpression':
      return call(node as jsep.CallExpression, look, text);
    default:
      throw new FormulaFailure('not-allowed', 'Only numbers, step ids, + − * / ** and the listed functions are allowed in a formula.');
  }
}

function binary(b: jsep.BinaryExpression, look: Lookup, text: string): Q {
  const l = evaluate(b.left, look, text);
  const r = evaluate(b.right, look, text);
  switch (b.operator) {
    case '+':
    case '-':
      if (!sameDimension(l.dim, r.dim)) {
        throw new FormulaFailure(
          'unit-mismatch',
          `Cannot ${b.operator === '+' ? 'add' : 'subtract'} ${describe(l.dim)} and ${describe(r.dim)}; give a number its unit in quotes, e.g. "0.2 Ω".`,
          text.indexOf(b.operator),
        );
      }
      return { dim: l.dim, value: b.operator === '+' ? l.value + r.value : l.value - r.value };
    case '*':
      return { dim: combine(l.dim, r.dim, 1), value: l.value * r.value };
    case '/':
      return { dim: combine(l.dim, r.dim, -1), value: l.value / r.value };
    case '**':
      if (!sameDimension(r.dim, NONE)) throw new FormulaFailure('unit-mismatch', 'A power must be a plain number (v ** 2).', text.indexOf('**'));
      return { dim: scale(l.dim, r.value), value: l.value ** r.value };
    default:
      throw new FormulaFailure('not-allowed', `The operator ${b.operator} is not allowed; use + − * / and **.`, text.indexOf(b.operator));
  }
}

function call(c: jsep.CallExpression, look: Lookup, text: string): Q {
  const name = c.callee.type === 'Identifier' ? (c.callee as jsep.Identifier).name : '';
  const fn = Object.hasOwn(FUNCTIONS, name) ? FUNCTIONS[name] : undefined;
  if (!fn) {
    throw new FormulaFailure('unknown-function', `${name || 'This'}() is not a formula function; use ${FORMULA_FUNCTIONS.join(', ')}.`, positionOf(text, name));
  }
  const [lo, hi] = fn.arity;
  if (c.arguments.length < lo || c.arguments.length > hi) {
    const want = lo === hi ? `${lo}` : `${lo} to ${hi}`;
    throw new FormulaFailure('wrong-arguments', `${name}() takes ${want} values, not ${c.arguments.length}.`, positionOf(text, name));
  }
  return fn.run(c.arguments.map((a) => evaluate(a, look, text)));
}

export type ParsedFormula =
  | { ok: true; ast: jsep.Expression; references: string[] }
  | { ok: false; error: FormulaError };

/** Collects identifiers that are not called as functions: the step ids the formula reads. */
function references(node: jsep.Expression, out: Set<string>): void {
  const stack: jsep.Expression[] = [node];
  while (stack.length) {
    const n = stack.pop()!;
    if (n.type === 'Identifier') out.add((n as jsep.Identifier).name);
    else if (n.type === 'CallExpression') stack.push(...(n as jsep.CallExpression).arguments);
    else if (n.type === 'BinaryExpression') stack.push((n as jsep.BinaryExpression).left, (n as jsep.BinaryExpression).right);
    else if (n.type === 'UnaryExpression') stack.push((n as jsep.UnaryExpression).argument);
  }
}

/** The longest formula and the deepest bracket nesting accepted (the document schema allows 500 characters too). */
export const MAX_FORMULA_LENGTH = 500;
export const MAX_FORMULA_DEPTH = 20;

function bracketDepth(text: string): number {
  let depth = 0;
  let deepest = 0;
  for (const ch of text) {
    if (ch === '(' || ch === '[') deepest = Math.max(deepest, ++depth);
    else if (ch === ')' || ch === ']') depth = Math.max(0, depth - 1);
  }
  return deepest;
}

/**
 * Parses a formula and lists the step ids it reads. Syntax errors carry the position.
 * Example: `parseFormula('parallel(a, b)')` → `{ ok: true, references: ['a', 'b'] }`;
 * `parseFormula('a +')` → `{ ok: false, error: { code: 'syntax', position: 3, ... } }`.
 */
export function parseFormula(expression: string): ParsedFormula {
  // Both checks are one pass over at most the text; the parser and the evaluator recurse, so
  // neither ever sees more than MAX_FORMULA_LENGTH characters or MAX_FORMULA_DEPTH brackets.
  if (expression.length > MAX_FORMULA_LENGTH) {
    return { ok: false, error: { code: 'too-long', message: `A formula has at most ${MAX_FORMULA_LENGTH} characters; this one has ${expression.length}. Split it over two Formula steps.` } };
  }
  const depth = bracketDepth(expression);
  if (depth > MAX_FORMULA_DEPTH) {
    return { ok: false, error: { code: 'too-deep', message: `Brackets may nest ${MAX_FORMULA_DEPTH} deep; this formula nests ${depth}. Split it over two Formula steps.` } };
  }
  let ast: jsep.Expression;
  try {
    ast = jsep(expression);
  } catch (e) {
    const err = e as { description?: string; index?: number };
    const at = err.index ?? 0;
    return { ok: false, error: { code: 'syntax', message: `${err.description ?? 'Cannot read the formula'} at character ${at + 1}.`, position: at } };
  }
  if (ast.type === 'Compound') {
    return { ok: false, error: { code: 'syntax', message: 'A formula is one expression; join the parts with an operator.' } };
  }
  const refs = new Set<string>();
  references(ast, refs);
  return { ok: true, ast, references: [...refs] };
}

/**
 * Evaluates a formula over earlier readings (base units) and checks its units; with `expect`,
 * the result must be of that quantity's kind.
 * Example: `evaluateFormula('parallel(a, b)', { a: { value: 680, quantity: 'resistance' }, b: { value: 680, quantity: 'resistance' } })`
 * → `{ ok: true, value: 340, quantity: 'resistance', ... }`.
 */
export function evaluateFormula(
  expression: string,
  values: Readonly<Record<string, FormulaValue | undefined>>,
  options: { expect?: Quantity; parsed?: ParsedFormula } = {},
): FormulaResult {
  // A caller that already parsed the expression (the soundness check) passes the result along.
  const parsed = options.parsed ?? parseFormula(expression);
  if (!parsed.ok) return parsed;
  const look: Lookup = (id) => {
    const v = Object.hasOwn(values, id) ? values[id] : undefined;
    if (!v) throw new FormulaFailure('unknown-step', `"${id}" has no value here: it is not an earlier Reading or Formula step on this path.`, positionOf(expression, id));
    return { value: v.value, dim: QUANTITY_INFO[v.quantity].dimension };
  };
  try {
    const r = evaluate(parsed.ast, look, expression);
    if (options.expect && !sameDimension(r.dim, QUANTITY_INFO[options.expect].dimension)) {
      throw new FormulaFailure('unit-mismatch', `This formula gives ${describe(r.dim)}, but the step expects a ${QUANTITY_INFO[options.expect].label}.`);
    }
    if (!Number.isFinite(r.value)) throw new FormulaFailure('math', 'The result is not a finite number (division by zero or the square root of a negative value).');
    const quantity = options.expect ?? quantitiesWithDimension(r.dim)[0] ?? null;
    return { ok: true, value: r.value, dimension: r.dim, quantity };
  } catch (e) {
    if (e instanceof FormulaFailure) {
      return { ok: false, error: e.position === undefined ? { code: e.code, message: e.message } : { code: e.code, message: e.message, position: e.position } };
    }
    throw e;
  }
}
