/**
 * Is a user's formula the engine's closed form? Two verdicts:
 *   symbolic — the formula, when rational in the parameters, is turned into exact algebra and
 *              n_user·d_engine − n_engine·d_user must be the zero polynomial;
 *   numeric  — the largest relative deviation |user − engine|/|engine| over seeded random rational points,
 *              in exact arithmetic for rational formulas (floating point otherwise).
 * When they differ, a hint from the ratio user/engine: a constant (sign, factor), the engine's value with the
 * species' labels exchanged or another quantity, a power law (wrong power of a parameter), or the parameters
 * the ratio depends on.
 */
import Fraction from 'fraction.js';
import { InputError } from '../../model/errors.js';
import { closedFormRatio, evaluateClosedForm, evaluateClosedFormNumber, isZeroForm, type ClosedForm } from './closed-form.js';
import { deriveQuantities, supportedQuantities, usesDistance, type DerivedQuantity, type SymbolicQuantity } from './derive.js';
import { evaluateFormula, parseFormula, type Formula } from './formula.js';
import { AlgebraTooCostly, rfEqual, rfEvaluate, type RationalFunction } from './rational-function.js';
import { pointByName, randomPoint, withDerived, xorshift32, type SamplePoint } from './sample-points.js';
import { symbolTable, type Centre, type PairLayout, type SymbolTable } from './symbols.js';

/** Largest relative deviation accepted as identity when only floating point is possible. */
export const NUMERIC_AGREEMENT = 1e-10;
/** Relative spread under which a ratio counts as constant. */
const CONSTANT_RATIO = 1e-9;

export interface CheckRequest {
  expression: string;
  quantity: SymbolicQuantity;
  layout: PairLayout;
  /** Random points for the numeric verdict (default 24). */
  points?: number;
  /** Seed of the points (default 1). */
  seed?: number;
}

export interface CheckSample {
  values: Record<string, number>;
  yours: number;
  engine: number;
}

export interface CheckResult {
  quantity: SymbolicQuantity;
  layout: PairLayout;
  expression: string;
  verdict: 'identical' | 'differs';
  symbolic: { status: 'identical' | 'differs' | 'undecided'; note: string };
  numeric: { points: number; seed: number; exact: boolean; maxDeviation: number; measure: 'relative' | 'absolute' };
  /** Why it differs, when it does and a reason can be seen. */
  hint: string | null;
  /** The first few points, for the report. */
  samples: CheckSample[];
  /** The engine's closed form (q, m, w; the verdicts compare against this one). */
  engine: DerivedQuantity;
  /** The same in the variables the formula uses (q, alpha, w when it uses alpha and not m), for the report. */
  engineShown: DerivedQuantity;
}

/** The names a formula for `quantity` may use. */
export function allowedNames(table: SymbolTable, quantity: SymbolicQuantity): string[] {
  const names = table.parameterIndices.map((i) => table.symbols[i].name);
  return usesDistance(quantity) ? [...names, 'R'] : names;
}

/** Evaluators of the user's formula and of closed forms at a point. */
interface Evaluators {
  yours(p: SamplePoint): Fraction | number | undefined;
  engine(form: ClosedForm, p: SamplePoint): Fraction | number;
}

function evaluators(table: SymbolTable, f: Formula): Evaluators {
  if ('rational' in f.exact) {
    const r = f.exact.rational;
    return { yours: (p) => rfEvaluate(r, p), engine: (form, p) => evaluateClosedForm(form, p) };
  }
  return {
    yours: (p) => {
      const v = evaluateFormula(f.tree, pointByName(table, p));
      return Number.isFinite(v) ? v : undefined;
    },
    engine: (form, p) => evaluateClosedFormNumber(form, p.map((x) => x.valueOf())),
  };
}

/**
 * A fraction as the nearest double, also when numerator and denominator exceed the double range (valueOf would
 * give ∞/∞ = NaN): both are shifted right to 64 significant bits first, and the shift difference is applied as
 * a power of two (common practice).
 */
export function fractionToNumber(f: Fraction): number {
  const direct = f.valueOf();
  if (Number.isFinite(direct) && (direct !== 0 || f.n === 0n)) return direct;
  const bits = (x: bigint) => x.toString(2).length;
  const sn = Math.max(0, bits(f.n) - 64), sd = Math.max(0, bits(f.d) - 64);
  const mant = Number(f.n >> BigInt(sn)) / Number(f.d >> BigInt(sd));
  const sign = f.s < 0n ? -1 : 1;
  // split the power of two so that neither factor overflows on its own
  const k = sn - sd;
  return sign * mant * 2 ** Math.trunc(k / 2) * 2 ** (k - Math.trunc(k / 2));
}

const num = (x: Fraction | number): number => (typeof x === 'number' ? x : fractionToNumber(x));

/** |yours − engine|/|engine| (|yours| where the engine value is 0), exact when both are exact. */
function deviation(y: Fraction | number, e: Fraction | number): number {
  if (typeof y !== 'number' && typeof e !== 'number') return fractionToNumber(e.equals(0) ? y.abs() : y.sub(e).abs().div(e.abs()));
  const yn = num(y), en = num(e);
  return en === 0 ? Math.abs(yn) : Math.abs(yn - en) / Math.abs(en);
}

/** Check a formula against the engine's closed form of one quantity. */
export function checkFormula(request: CheckRequest): CheckResult {
  const { layout, quantity } = request;
  const points = request.points ?? 24;
  const seed = request.seed ?? 1;
  const table = symbolTable(layout);
  if (!supportedQuantities(layout).includes(quantity)) {
    throw new InputError('quantity', `${quantity} is not derived for this layout; available: ${supportedQuantities(layout).join(', ')}`);
  }
  const formula = parseFormula(request.expression, table, allowedNames(table, quantity));
  const derived = deriveQuantities(layout, supportedQuantities(layout));
  const engine = derived.find((d) => d.name === quantity)!;
  const ev = evaluators(table, formula);

  // Symbolic verdict.
  let symbolic: CheckResult['symbolic'];
  const same = 'rational' in formula.exact ? exactlyEqual(formula.exact.rational, engine.form) : undefined;
  if (typeof same === 'boolean') {
    symbolic = same
      ? { status: 'identical', note: "your formula minus the engine's reduces to zero exactly" }
      : { status: 'differs', note: "your formula minus the engine's is a non-zero rational function" };
  } else if (same !== undefined) {
    symbolic = { status: 'undecided', note: `no exact comparison: ${same.tooCostly}` };
  } else {
    symbolic = { status: 'undecided', note: `no exact comparison: ${'reason' in formula.exact ? formula.exact.reason : 'not rational'}` };
  }

  // Numeric verdict on seeded points (points where your formula is undefined are replaced).
  const rand = xorshift32(seed);
  const pts: SamplePoint[] = [];
  const yours: Array<Fraction | number> = [];
  const mine: Array<Fraction | number> = [];
  for (let attempt = 0; pts.length < points; attempt++) {
    if (attempt > 4 * points + 20) throw new InputError('expression', 'is undefined (division by zero or not finite) at almost every sample point');
    const p = randomPoint(table, rand);
    const y = ev.yours(p);
    if (y === undefined) continue;
    pts.push(p);
    yours.push(y);
    mine.push(ev.engine(engine.form, p));
  }
  const deviations = pts.map((_, i) => deviation(yours[i], mine[i]));
  const maxDeviation = deviations.reduce((a, b) => (b > a || Number.isNaN(b) ? b : a), 0);
  const measure = mine.some((e) => num(e) === 0) ? 'absolute' : 'relative';
  const exact = 'rational' in formula.exact;
  const identical = symbolic.status === 'undecided' ? maxDeviation <= NUMERIC_AGREEMENT : symbolic.status === 'identical';
  // The first points for the report, over q, m, w (and R) plus whatever else the formula uses.
  const shown = new Set([...powerLawParams(table, usesDistance(quantity)).map((i) => table.symbols[i].name), ...formula.names]);
  const columns = allowedNames(table, quantity).filter((n) => shown.has(n));
  const samples = pts.slice(0, 3).map((p, i) => {
    const byName = pointByName(table, p);
    return { values: Object.fromEntries(columns.map((n) => [n, byName.get(n)!])), yours: num(yours[i]), engine: num(mine[i]) };
  });
  return {
    quantity,
    layout: { ...layout },
    expression: request.expression,
    verdict: identical ? 'identical' : 'differs',
    symbolic,
    numeric: { points: pts.length, seed, exact, maxDeviation, measure },
    hint: identical ? null : explainDifference(table, formula, ev, engine, derived, pts, yours.map(num)),
    samples,
    engine,
    engineShown: usesAlphaOnly(table, formula) ? deriveQuantities(layout, [quantity], 'alpha')[0] : engine,
  };
}

/** n_user·d_engine − n_engine·d_user = 0, or why the exact algebra was not attempted ({@link EXACT_LIMITS}). */
function exactlyEqual(r: RationalFunction, form: ClosedForm): boolean | { tooCostly: string } {
  try {
    return rfEqual(r, closedFormRatio(form));
  } catch (e) {
    if (e instanceof AlgebraTooCostly) return { tooCostly: `exact algebra would be too costly (${e.message})` };
    throw e;
  }
}

/** A rational reading of a number, when it is a simple one (denominator ≤ 1000), or π times one. */
function recognise(x: number): string | undefined {
  const simple = (y: number): string | undefined => {
    if (!Number.isFinite(y) || y === 0) return undefined;
    const f = new Fraction(y);
    if (f.d > 1000n || Math.abs(f.valueOf() - y) > 1e-9 * Math.abs(y)) return undefined;
    return f.toFraction();
  };
  const plain = simple(x);
  if (plain) return plain;
  const overPi = simple(x / Math.PI);
  if (overPi) return overPi === '1' ? 'π' : overPi === '-1' ? '-π' : `${overPi}·π`;
  const timesPi = simple(x * Math.PI);
  if (timesPi) return `${timesPi}/π`;
  return undefined;
}

/** "yours = c × …" phrased: sign and size of a constant factor. */
function factorPhrase(c: number): string {
  const size = Math.abs(c);
  const text = recognise(size) ?? size.toPrecision(6);
  const sign = c < 0 ? 'wrong sign' : '';
  if (Math.abs(size - 1) <= CONSTANT_RATIO) return sign;
  const inv = recognise(1 / size) ?? (1 / size).toPrecision(6);
  const factor = size > 1 ? `a factor ${text} too large` : `a factor ${inv} too small`;
  return sign ? `${sign} and ${factor}` : factor;
}

const isConstant = (r: readonly number[]): boolean =>
  r.length > 0 && r.every((x) => Number.isFinite(x) && Math.abs(x - r[0]) <= CONSTANT_RATIO * Math.abs(r[0]));

/** The hint: what the ratio yours/engine looks like. */
function explainDifference(
  table: SymbolTable,
  formula: Formula,
  ev: Evaluators,
  engine: DerivedQuantity,
  derived: readonly DerivedQuantity[],
  pts: readonly SamplePoint[],
  yours: readonly number[],
): string | null {
  if (isZeroForm(engine.form)) return `the engine's ${engine.name} is exactly 0 here; yours is not`;
  if (yours.every((y) => y === 0)) return 'yours is zero at every sample point';
  const ratiosTo = (form: ClosedForm, map: (p: SamplePoint) => SamplePoint = (p) => p) =>
    pts.map((p, i) => yours[i] / num(ev.engine(form, map(p))));
  const r = ratiosTo(engine.form);
  if (isConstant(r)) return `yours = ${recognise(r[0]) ?? r[0].toPrecision(6)} × the engine's ${engine.name}: ${factorPhrase(r[0])}`;

  // The engine's value with labels exchanged, or another quantity.
  const candidates: Array<{ says: string; ratios: number[] }> = [];
  if (!table.layout.identical) {
    for (const [label, roles] of [
      ['A and B exchanged (every a ↔ b)', ['q', 'm', 'w']],
      ['the frequencies of A and B exchanged', ['w']],
      ['the masses exchanged (ma ↔ mb)', ['m']],
      ['the charges exchanged (qa ↔ qb)', ['q']],
    ] as const) {
      candidates.push({ says: `yours is the engine's ${engine.name} with ${label}`, ratios: ratiosTo(engine.form, (p) => exchange(table, p, roles)) });
    }
  }
  for (const other of derived) {
    if (other.name === engine.name || isZeroForm(other.form) || usesDistance(other.name) !== usesDistance(engine.name)) continue;
    candidates.push({ says: `yours is the engine's ${other.name}, not its ${engine.name}`, ratios: ratiosTo(other.form) });
  }
  // An exact match (ratio 1) first, then one up to a constant factor.
  const matching = candidates.filter((c) => isConstant(c.ratios));
  const best = matching.find((c) => factorPhrase(c.ratios[0]) === '') ?? matching[0];
  if (best) {
    const phrase = factorPhrase(best.ratios[0]);
    return phrase ? `${best.says}, with ${phrase}` : best.says;
  }

  // A power law: yours/engine = c · Π v^k, exponents found by doubling one of q, m, w (and R) at a time.
  const base = pts[0];
  const params = powerLawParams(table, formula.names.has('R'));
  const powers = params.map((i) => {
    const doubled = [...base];
    doubled[i] = doubled[i].mul(2);
    const p2 = withDerived(table, doubled);
    const y2 = ev.yours(p2);
    if (y2 === undefined) return NaN;
    const k = Math.log2(num(y2) / num(ev.engine(engine.form, p2)) / r[0]);
    const rounded = Math.round(k * 2) / 2;
    return Math.abs(k - rounded) < 1e-6 ? rounded : NaN;
  });
  if (powers.every((k) => !Number.isNaN(k)) && powers.some((k) => k !== 0)) {
    const residual = pts.map((p, i) => r[i] / params.reduce((acc, idx, j) => acc * p[idx].valueOf() ** powers[j], 1));
    if (isConstant(residual)) {
      const factors = inUserBasis(table, formula, params, powers);
      const c = residual[0];
      const head = Math.abs(c - 1) <= CONSTANT_RATIO ? '' : `${recognise(c) ?? c.toPrecision(6)} · `;
      const mono = factors.map((f) => (f.k === 1 ? f.name : `${f.name}^${f.k < 0 || !Number.isInteger(f.k) ? `(${f.k})` : f.k}`)).join(' · ');
      return `yours / engine = ${head}${mono}: check the power${factors.length > 1 ? 's' : ''} of ${factors.map((f) => f.name).join(', ')}`;
    }
  }
  const depends = params.filter((_, j) => Number.isNaN(powers[j]) || powers[j] !== 0).map((i) => table.symbols[i].name);
  const first = r.slice(0, 3).map((x) => x.toPrecision(6)).join(', ');
  return `yours / engine is neither a constant nor a power law; it changes with ${depends.join(', ') || 'the parameters'} (ratios at the first points: ${first})${oneCentreNote(table, formula)}`;
}

/** A like-pair formula checked as an unlike pair uses one centre's names only: say how to check it as intended. */
function oneCentreNote(table: SymbolTable, formula: Formula): string {
  if (table.layout.identical) return '';
  const centres = new Set(table.symbols.filter((s) => s.centre && formula.names.has(s.name)).map((s) => s.centre));
  return centres.size === 1 ? `; your formula uses the parameters of one species only: for a like pair, check with --identical (names q, m, w, alpha)` : '';
}

/** True when the formula uses some alpha and no mass (isotropic layouts only). */
function usesAlphaOnly(table: SymbolTable, formula: Formula): boolean {
  const names = (role: 'alpha' | 'm') => table.symbols.filter((s) => s.role === role).map((s) => s.name);
  return names('alpha').some((n) => formula.names.has(n)) && !names('m').some((n) => formula.names.has(n));
}

/** The independent parameters q, m, w of each species (and R). */
function powerLawParams(table: SymbolTable, withR: boolean): number[] {
  const centres: Centre[] = table.layout.identical ? ['a'] : ['a', 'b'];
  const out = centres.flatMap((c) => [table.q[c], table.m[c], ...new Set(table.w[c])]);
  return withR ? [...out, table.R] : out;
}

/**
 * Exponents over q, m, w rewritten over q, alpha, w for a species whose alpha (not m) the formula uses:
 * m = q²/(alpha w²), so q^a m^b w^c = q^(a+2b) alpha^(−b) w^(c−2b).
 */
function inUserBasis(table: SymbolTable, formula: Formula, params: readonly number[], powers: readonly number[]): Array<{ name: string; k: number }> {
  const k = new Map(params.map((i, j) => [i, powers[j]]));
  for (const c of table.layout.identical ? (['a'] as const) : (['a', 'b'] as const)) {
    const alpha = table.alpha[c];
    if (alpha < 0 || !formula.names.has(table.symbols[alpha].name) || formula.names.has(table.symbols[table.m[c]].name)) continue;
    const b = k.get(table.m[c]) ?? 0;
    k.delete(table.m[c]);
    k.set(table.q[c], (k.get(table.q[c]) ?? 0) + 2 * b);
    k.set(alpha, -b);
    k.set(table.w[c][0], (k.get(table.w[c][0]) ?? 0) - 2 * b);
  }
  const order = [...k.keys()].sort((i, j) => i - j);
  return order.filter((i) => k.get(i) !== 0).map((i) => ({ name: table.symbols[i].name, k: k.get(i)! }));
}

/** The point with A's and B's values of the given roles exchanged (alpha recomputed). */
function exchange(table: SymbolTable, p: SamplePoint, roles: readonly ('q' | 'm' | 'w')[]): SamplePoint {
  const out = [...p];
  for (const role of roles) {
    const pairs = role === 'w' ? [0, 1, 2].map((axis) => [table.w.a[axis], table.w.b[axis]] as const) : [[table[role].a, table[role].b] as const];
    for (const [i, j] of pairs) [out[i], out[j]] = [p[j], p[i]];
  }
  return withDerived(table, out);
}
