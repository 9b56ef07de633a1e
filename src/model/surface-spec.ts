/**
 * Surfaces an atom can sit in front of: a perfect conductor, or a dielectric half-space described by its
 * dielectric function at imaginary frequency eps(iu). Plain data, validated here; atomic units (u in hartree).
 *
 * Spec strings (our own syntax, as typed after `--surface`):
 *   conductor                                   perfect conductor (image charge −e)
 *   eps=5.2                                     constant (static) dielectric constant
 *   drude:wp=0.35,gamma=0.004                   Drude metal, eps(iu) = 1 + wp²/(u(u + gamma))
 *   drude-lorentz:wp=0.3,w0=0,gamma=0.01;wp=0.5,w0=0.4,gamma=0.02
 *                                               Drude–Lorentz sum, eps(iu) = 1 + Σ_j wp_j²/(w0_j² + u² + gamma_j u)
 *   table:FILE                                  a table of eps(iu) (format below; the CLI reads the file)
 *
 * Table format (comma-separated, like the response-data files of response-data.ts):
 *   # comments;  name = …  and  source = …  settings before the header
 *   u [Eh], eps                                 ← header: u in Eh or eV, eps dimensionless
 *   0, 12.1
 *   …                                           ← u strictly increasing from ≥ 0, eps(iu) ≥ 1
 *
 * Physics (J. D. Jackson, Classical Electrodynamics, 3rd ed. 1999, §4.4; common practice): a charge e at height z
 * over a dielectric half-space with constant eps sees an image charge −e (eps − 1)/(eps + 1) at the mirror point;
 * in the non-retarded limit each frequency component of the atom's fluctuating charge is imaged with
 * Δ(iu) = (eps(iu) − 1)/(eps(iu) + 1) (A. D. McLachlan, Mol. Phys. 6, 423 (1963)). eps(iu) is real and ≥ 1 for
 * every passive medium (L. D. Landau, E. M. Lifshitz, Electrodynamics of Continuous Media, §62), so 0 ≤ Δ ≤ 1.
 */
import { InputError, describeValue } from './errors.js';
import { HARTREE_IN_EV } from './units.js';

/**
 * Allowed ranges of Drude–Lorentz parameters, hartree (derived here): wp in [1e-6, 1e6], w0 and gamma 0 or in
 * (0, 1e6]. Then wp² ≤ 1e12 and w0² + u² + gamma·u stay far inside the double range (max ≈ 1.8e308), so eps(iu) − 1
 * is finite wherever the denominator is non-zero, and the quadrature scale max(wp, w0)/√2 stays within twelve
 * decades of atomic frequencies; wp ≥ 1e-6 keeps eps − 1 ≥ 1e-12/(w0² + u² + gamma u) away from underflow.
 */
export const LORENTZ_RANGE = { wpMin: 1e-6, max: 1e6 } as const;

/** A plasma (strength) frequency within {@link LORENTZ_RANGE}, hartree. */
function plasmaFrequency(field: string, value: unknown): number {
  const x = typeof value === 'string' && value.trim() !== '' ? Number(value) : value;
  if (typeof x !== 'number' || !(x >= LORENTZ_RANGE.wpMin) || !(x <= LORENTZ_RANGE.max)) {
    throw new InputError(field, `must be a plasma frequency from ${LORENTZ_RANGE.wpMin} to ${LORENTZ_RANGE.max} hartree (keeps eps(iu) finite in double precision), got ${describeValue(value)}`);
  }
  return x;
}

/** One Drude–Lorentz oscillator: eps(iu) − 1 ∋ wp²/(w0² + u² + gamma u); w0 = 0 is a Drude (free-electron) term. */
export interface LorentzTerm {
  /** Plasma (strength) frequency, hartree. */
  wp: number;
  /** Resonance frequency, hartree (0 for a Drude term). */
  w0: number;
  /** Damping, hartree. */
  gamma: number;
}

/** A surface, plain data. */
export type SurfaceSpec =
  | { kind: 'conductor' }
  | { kind: 'constant'; eps: number }
  | { kind: 'drude-lorentz'; terms: LorentzTerm[]; /** how it was written: 'drude' for one free-electron term */ form: 'drude' | 'drude-lorentz' }
  | { kind: 'table'; u: number[]; eps: number[]; name: string; source?: string };

/** The spec syntax in one line, for help texts and error messages. */
export const SURFACE_SPEC_HELP =
  'conductor | eps=VALUE | drude:wp=…,gamma=… | drude-lorentz:wp=…,w0=…,gamma=…;wp=…,… | table:FILE (columns "u [Eh], eps"); frequencies in hartree (wp 1e-6…1e6, w0 and gamma 0…1e6)';

const TABLE_MIN_ROWS = 4;

/**
 * Parse a surface spec. `readFile` is asked for the text of a `table:FILE` (only the CLI touches files).
 * Errors are InputErrors naming `field` (the option, e.g. `--surface`) or the table's `file:line:column`.
 */
export function parseSurfaceSpec(spec: string, field = 'surface', readFile?: (path: string) => string): SurfaceSpec {
  const text = spec.trim();
  if (text === 'conductor') return { kind: 'conductor' };
  const eq = /^eps\s*=\s*(.*)$/.exec(text);
  if (eq) return constantSurface(eq[1], `${field}.eps`);
  const colon = text.indexOf(':');
  const head = colon < 0 ? text : text.slice(0, colon);
  const body = colon < 0 ? '' : text.slice(colon + 1);
  switch (head) {
    case 'drude':
      return { kind: 'drude-lorentz', form: 'drude', terms: [lorentzTerm(body, `${field}.drude`, ['wp', 'gamma'])] };
    case 'drude-lorentz': {
      const parts = body.split(';').map((s) => s.trim()).filter(Boolean);
      if (parts.length === 0) throw new InputError(`${field}.drude-lorentz`, 'needs at least one term wp=…,w0=…,gamma=… (terms separated by ";")');
      return { kind: 'drude-lorentz', form: 'drude-lorentz', terms: parts.map((p, j) => lorentzTerm(p, `${field}.drude-lorentz[${j}]`, ['wp', 'w0', 'gamma'])) };
    }
    case 'table': {
      if (body.trim() === '') throw new InputError(`${field}.table`, 'needs a file name, e.g. table:eps.csv');
      if (!readFile) throw new InputError(`${field}.table`, 'a table file can only be read by the command line; pass the parsed table instead');
      return parseEpsTable(readFile(body.trim()), body.trim());
    }
    default:
      throw new InputError(field, `unknown surface ${describeValue(text)}; allowed: ${SURFACE_SPEC_HELP}`);
  }
}

/** A constant-eps dielectric; eps must be finite and ≥ 1. */
export function constantSurface(value: unknown, field = 'surface.eps'): SurfaceSpec {
  const x = typeof value === 'string' && value.trim() !== '' ? Number(value) : value;
  if (typeof x !== 'number' || !(x >= 1) || !Number.isFinite(x)) {
    throw new InputError(field, `must be a finite number ≥ 1 (eps(iu) of a passive medium is at least 1), got ${describeValue(value)}`);
  }
  return { kind: 'constant', eps: x };
}

function lorentzTerm(body: string, field: string, allowed: readonly string[]): LorentzTerm {
  const fields: Record<string, string> = {};
  for (const part of body.split(',').map((s) => s.trim()).filter(Boolean)) {
    const k = part.indexOf('=');
    const key = k < 0 ? part : part.slice(0, k).trim();
    if (k < 0 || !allowed.includes(key)) throw new InputError(`${field}.${key}`, `unknown or incomplete field; allowed: ${allowed.map((a) => `${a}=…`).join(',')}`);
    if (key in fields) throw new InputError(`${field}.${key}`, 'is given twice');
    fields[key] = part.slice(k + 1).trim();
  }
  if (fields.wp === undefined) throw new InputError(`${field}.wp`, `is required: a plasma frequency from ${LORENTZ_RANGE.wpMin} to ${LORENTZ_RANGE.max} Eh`);
  const wp = plasmaFrequency(`${field}.wp`, fields.wp);
  const gamma = nonNegative(`${field}.gamma`, fields.gamma ?? '0');
  const w0 = allowed.includes('w0') ? nonNegative(`${field}.w0`, fields.w0 ?? '0') : 0;
  return { wp, w0, gamma };
}

/** A resonance or damping frequency: 0 or up to {@link LORENTZ_RANGE}.max hartree. */
function nonNegative(field: string, value: string): number {
  const x = value.trim() === '' ? NaN : Number(value);
  if (!(x >= 0) || !(x <= LORENTZ_RANGE.max)) throw new InputError(field, `must be a number from 0 to ${LORENTZ_RANGE.max} (hartree), got ${describeValue(value)}`);
  return x;
}

const U_UNITS: Record<string, number> = { Eh: 1, hartree: 1, eV: 1 / HARTREE_IN_EV };

/** Parse a table of eps(iu) (format in the module comment); errors name `file:line:column`. */
export function parseEpsTable(text: string, fileName: string): SurfaceSpec {
  const at = (line: number, col?: number) => `${fileName}:${line}${col !== undefined ? `:${col}` : ''}`;
  const settings: Record<string, string> = {};
  let header: { u: number; eps: number; factor: number; line: number; columns: number } | undefined;
  const u: number[] = [], eps: number[] = [];
  let lastLine = 0;
  text.split(/\r?\n/).forEach((raw, i) => {
    const line = raw.trim().replace(/\s+#.*$/, '');
    const n = i + 1;
    if (line === '' || line.startsWith('#')) return;
    if (!header) {
      const e = line.indexOf('=');
      if (e > 0 && !line.includes(',')) {
        const key = line.slice(0, e).trim();
        if (key !== 'name' && key !== 'source') throw new InputError(at(n, 1), `unknown setting ${JSON.stringify(key)}; allowed settings: name, source`);
        settings[key] = line.slice(e + 1).trim();
        return;
      }
      const cells = line.split(',').map((c) => c.trim());
      const cols = cells.map((c) => /^([^[\]]*?)\s*(?:\[([^\]]*)\])?$/.exec(c)).map((m, k) => ({ label: m?.[1].trim() ?? cells[k], unit: m?.[2]?.trim() ?? '' }));
      const iu = cols.findIndex((c) => c.label === 'u');
      const ie = cols.findIndex((c) => c.label === 'eps');
      if (iu < 0 || ie < 0 || cols.length !== 2) throw new InputError(at(n, 1), 'the header must be "u [Eh], eps" (or u [eV]): two columns, u and eps');
      const factor = U_UNITS[cols[iu].unit];
      if (factor === undefined) throw new InputError(at(n, iu + 1), `column u needs a unit in brackets, one of: ${Object.keys(U_UNITS).join(', ')}; got ${JSON.stringify(cols[iu].unit)}`);
      if (cols[ie].unit !== '' && cols[ie].unit !== '1') throw new InputError(at(n, ie + 1), `eps is dimensionless (no unit or [1]), got ${JSON.stringify(cols[ie].unit)}`);
      header = { u: iu, eps: ie, factor, line: n, columns: 2 };
      return;
    }
    const cells = line.split(',').map((c) => c.trim());
    if (cells.length !== header.columns) throw new InputError(at(n, Math.min(cells.length, header.columns) + 1), `has ${cells.length} values, the header has ${header.columns} columns`);
    const x = cells.map(Number);
    cells.forEach((c, k) => {
      if (c === '' || !Number.isFinite(x[k])) throw new InputError(at(n, k + 1), `${k === header!.u ? 'u' : 'eps'} must be a finite number, got ${describeValue(c)}`);
    });
    const uk = x[header.u] * header.factor, ek = x[header.eps];
    if (!(uk >= 0)) throw new InputError(at(n, header.u + 1), `u must be ≥ 0, got ${cells[header.u]}`);
    if (u.length > 0 && !(uk > u[u.length - 1])) {
      throw new InputError(at(n, header.u + 1), `the u grid must increase strictly (sorted table): ${cells[header.u]} follows ${u[u.length - 1] / header.factor}`);
    }
    if (!(ek >= 1)) throw new InputError(at(n, header.eps + 1), `eps(iu) must be ≥ 1 (a passive medium), got ${cells[header.eps]}`);
    u.push(uk);
    eps.push(ek);
    lastLine = n;
  });
  if (!header) throw new InputError(fileName, 'has no header line; expected "u [Eh], eps"');
  if (u.length < TABLE_MIN_ROWS) throw new InputError(at(lastLine || header.line), `a table needs at least ${TABLE_MIN_ROWS} rows for interpolation, got ${u.length}`);
  const name = settings.name || fileName.split(/[\\/]/).pop()!.replace(/\.[^.]*$/, '');
  return { kind: 'table', u, eps, name, source: settings.source ?? `user data from ${fileName}` };
}

/** A one-line description of a surface (atomic units); `num` formats each number (reports pass their --digits formatter). */
export function describeSurface(s: SurfaceSpec, num: (x: number) => string = String): string {
  switch (s.kind) {
    case 'conductor':
      return 'perfect conductor (image charges)';
    case 'constant':
      return `dielectric, constant eps = ${num(s.eps)} (image factor (eps−1)/(eps+1) = ${num((s.eps - 1) / (s.eps + 1))})`;
    case 'drude-lorentz':
      return s.form === 'drude'
        ? `Drude metal, wp = ${num(s.terms[0].wp)} Eh, gamma = ${num(s.terms[0].gamma)} Eh`
        : `Drude–Lorentz dielectric, ${s.terms.length} term(s): ${s.terms.map((t) => `wp=${num(t.wp)},w0=${num(t.w0)},gamma=${num(t.gamma)}`).join('; ')} (Eh)`;
    case 'table':
      return `table of eps(iu) "${s.name}": ${s.u.length} points u = ${num(s.u[0])}…${num(s.u[s.u.length - 1])} Eh`;
  }
}

/**
 * Check a surface given as plain data (library callers; the parsers above already check): eps ≥ 1 (constant and
 * tabulated), positive plasma frequencies, non-negative resonances and dampings, a strictly increasing u grid ≥ 0.
 */
export function validateSurface(s: SurfaceSpec, field = 'surface'): SurfaceSpec {
  switch (s.kind) {
    case 'conductor':
      return s;
    case 'constant':
      constantSurface(s.eps, `${field}.eps`);
      return s;
    case 'drude-lorentz':
      if (!Array.isArray(s.terms) || s.terms.length === 0) throw new InputError(`${field}.terms`, 'must list at least one term {wp, w0, gamma}');
      s.terms.forEach((t, j) => {
        plasmaFrequency(`${field}.terms[${j}].wp`, t.wp);
        nonNegative(`${field}.terms[${j}].w0`, String(t.w0));
        nonNegative(`${field}.terms[${j}].gamma`, String(t.gamma));
      });
      return s;
    case 'table':
      if (s.u.length !== s.eps.length || s.u.length < TABLE_MIN_ROWS) throw new InputError(`${field}.u`, `needs at least ${TABLE_MIN_ROWS} points and one eps per u`);
      s.u.forEach((u, k) => {
        if (!(u >= 0) || !Number.isFinite(u) || (k > 0 && !(u > s.u[k - 1]))) throw new InputError(`${field}.u[${k}]`, `must be finite, ≥ 0 and strictly increasing (sorted), got ${u}`);
        if (!(s.eps[k] >= 1) || !Number.isFinite(s.eps[k])) throw new InputError(`${field}.eps[${k}]`, `must be a finite number ≥ 1 (a passive medium), got ${s.eps[k]}`);
      });
      return s;
  }
}
