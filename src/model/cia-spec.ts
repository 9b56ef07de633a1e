/**
 * The command-line specs of a CIA computation (dispole cia): --potential, --dipole and table files.
 *   tt:A=<Eh>,b=<1/bohr>[,C6=…,C8=…,C10=…]        Tang–Toennies (C_n in Eh·a0^n)
 *   hfd:<set>                                      a built-in HFD parameter set (He-He, Ar-Ar)
 *   table:<file>[,R=bohr|angstrom][,V=hartree|kelvin|cm-1|mev]
 *   exp:mu0=<e·a0>,R0=<bohr>,rho=<bohr>[,gauss=<e·a0>,sigma=<bohr>][,damp=<1/bohr>|none][,D7=…][,D9=…]
 *   table:<file>[,R=bohr|angstrom][,mu=au|debye]
 * Table files: two numeric columns (R, value) separated by blanks or a comma; lines starting with # and blank
 * lines are skipped. Units are converted here (CODATA 2018 constants of units.ts).
 */
import { InputError } from './errors.js';
import { requireFinite, requirePositive } from './validate.js';
import { BOHR_IN_ANGSTROM, BOLTZMANN_IN_HARTREE_PER_KELVIN, DIPOLE_AU_IN_DEBYE, HARTREE_IN_EV, HARTREE_IN_WAVENUMBER } from './units.js';

export type PotentialArgument =
  | { kind: 'tt'; A: number; b: number; C6?: number; C8?: number; C10?: number }
  | { kind: 'hfd'; set: string }
  | { kind: 'table'; file: string; lengthUnit: 'bohr' | 'angstrom'; energyUnit: EnergyUnit };

export type DipoleArgument =
  | { kind: 'exp'; mu0: number; R0: number; rho: number; gauss?: { amplitude: number; sigma: number }; damping?: number | 'none'; D7?: number; D9?: number }
  | { kind: 'table'; file: string; lengthUnit: 'bohr' | 'angstrom'; dipoleUnit: 'au' | 'debye' };

export type EnergyUnit = 'hartree' | 'kelvin' | 'cm-1' | 'mev';

/** Energy in the given unit → Eh. */
export const ENERGY_TO_HARTREE: Readonly<Record<EnergyUnit, number>> = {
  hartree: 1,
  kelvin: BOLTZMANN_IN_HARTREE_PER_KELVIN,
  'cm-1': 1 / HARTREE_IN_WAVENUMBER,
  mev: 1e-3 / HARTREE_IN_EV,
};

/** Split "kind:a=1,b=2" into the kind, a leading bare word (file or set name) and the key=value fields. */
function splitSpec(field: string, spec: string): { kind: string; head?: string; fields: Map<string, string> } {
  const colon = spec.indexOf(':');
  if (colon < 1) throw new InputError(field, `must look like kind:key=value,…, got ${JSON.stringify(spec)}`);
  const kind = spec.slice(0, colon).trim().toLowerCase();
  const parts = spec.slice(colon + 1).split(',').map((p) => p.trim()).filter(Boolean);
  const fields = new Map<string, string>();
  let head: string | undefined;
  parts.forEach((p, i) => {
    const eq = p.indexOf('=');
    if (eq < 0) {
      if (i > 0) throw new InputError(field, `"${p}" is not key=value`);
      head = p;
      return;
    }
    const key = p.slice(0, eq).trim();
    if (fields.has(key)) throw new InputError(`${field}.${key}`, 'is given twice');
    fields.set(key, p.slice(eq + 1).trim());
  });
  return { kind, head, fields };
}

function onlyKeys(field: string, fields: Map<string, string>, allowed: readonly string[]): void {
  for (const k of fields.keys()) if (!allowed.includes(k)) throw new InputError(`${field}.${k}`, `unknown key; allowed: ${allowed.join(', ')}`);
}

function pick<T extends string>(field: string, value: string | undefined, allowed: readonly T[], fallback: T): T {
  if (value === undefined) return fallback;
  const v = value.toLowerCase() as T;
  if (!allowed.includes(v)) throw new InputError(field, `must be one of ${allowed.join(', ')}, got ${JSON.stringify(value)}`);
  return v;
}

/** Parse --potential. */
export function parsePotentialArgument(spec: string, field = '--potential'): PotentialArgument {
  const { kind, head, fields } = splitSpec(field, spec);
  if (kind === 'tt') {
    if (head !== undefined) throw new InputError(field, `"${head}" is not key=value (tt:A=<Eh>,b=<1/bohr>)`);
    onlyKeys(field, fields, ['A', 'b', 'C6', 'C8', 'C10']);
    const A = requireFinite(`${field}.A`, fields.get('A'));
    if (!(A > 0)) throw new InputError(`${field}.A`, `the Born–Mayer repulsion must be > 0 (Eh), got ${A}: a negative repulsion has no repulsive wall`);
    const out: PotentialArgument = { kind: 'tt', A, b: requirePositive(`${field}.b`, fields.get('b')) };
    for (const k of ['C6', 'C8', 'C10'] as const) if (fields.has(k)) out[k] = requireFinite(`${field}.${k}`, fields.get(k));
    return out;
  }
  if (kind === 'hfd') {
    if (head === undefined || fields.size > 0) throw new InputError(field, 'must be hfd:<set>, e.g. hfd:He-He');
    return { kind: 'hfd', set: head };
  }
  if (kind === 'table') {
    if (head === undefined) throw new InputError(field, 'must be table:<file>[,R=bohr|angstrom][,V=hartree|kelvin|cm-1|mev]');
    onlyKeys(field, fields, ['R', 'V']);
    return { kind: 'table', file: head, lengthUnit: pick(`${field}.R`, fields.get('R'), ['bohr', 'angstrom'] as const, 'bohr'), energyUnit: pick(`${field}.V`, fields.get('V'), ['hartree', 'kelvin', 'cm-1', 'mev'] as const, 'hartree') };
  }
  throw new InputError(field, `unknown potential kind ${JSON.stringify(kind)}; use tt:…, hfd:<set> or table:<file>`);
}

/** Parse --dipole. */
export function parseDipoleArgument(spec: string, field = '--dipole'): DipoleArgument {
  const { kind, head, fields } = splitSpec(field, spec);
  if (kind === 'exp') {
    if (head !== undefined) throw new InputError(field, `"${head}" is not key=value (exp:mu0=<e·a0>,R0=<bohr>,rho=<bohr>)`);
    onlyKeys(field, fields, ['mu0', 'R0', 'rho', 'gauss', 'sigma', 'damp', 'D7', 'D9']);
    const out: DipoleArgument = {
      kind: 'exp',
      mu0: requireFinite(`${field}.mu0`, fields.get('mu0')),
      R0: requirePositive(`${field}.R0`, fields.get('R0')),
      rho: requirePositive(`${field}.rho`, fields.get('rho')),
    };
    if (fields.has('gauss') !== fields.has('sigma')) throw new InputError(`${field}.${fields.has('gauss') ? 'sigma' : 'gauss'}`, 'the Gaussian correction needs both gauss=<e·a0> and sigma=<bohr>');
    if (fields.has('gauss')) out.gauss = { amplitude: requireFinite(`${field}.gauss`, fields.get('gauss')), sigma: requirePositive(`${field}.sigma`, fields.get('sigma')) };
    const damp = fields.get('damp');
    if (damp !== undefined) out.damping = damp.toLowerCase() === 'none' ? 'none' : requirePositive(`${field}.damp`, damp);
    if (fields.has('D7')) out.D7 = requireFinite(`${field}.D7`, fields.get('D7'));
    if (fields.has('D9')) out.D9 = requireFinite(`${field}.D9`, fields.get('D9'));
    return out;
  }
  if (kind === 'table') {
    if (head === undefined) throw new InputError(field, 'must be table:<file>[,R=bohr|angstrom][,mu=au|debye]');
    onlyKeys(field, fields, ['R', 'mu']);
    return { kind: 'table', file: head, lengthUnit: pick(`${field}.R`, fields.get('R'), ['bohr', 'angstrom'] as const, 'bohr'), dipoleUnit: pick(`${field}.mu`, fields.get('mu'), ['au', 'debye'] as const, 'au') };
  }
  throw new InputError(field, `unknown dipole kind ${JSON.stringify(kind)}; use exp:… or table:<file>`);
}

/**
 * Read a two-column table (R, value) and convert: R to bohr, value by `scale`. Errors name file:line.
 */
export function parseTwoColumnTable(text: string, file: string, lengthUnit: 'bohr' | 'angstrom', scale: number): { R: number[]; values: number[] } {
  const R: number[] = [], values: number[] = [];
  const toBohr = lengthUnit === 'bohr' ? 1 : 1 / BOHR_IN_ANGSTROM;
  text.split(/\r?\n/).forEach((raw, i) => {
    const line = raw.trim();
    if (line === '' || line.startsWith('#')) return;
    const cols = line.split(/[\s,;]+/).filter(Boolean);
    if (cols.length < 2) throw new InputError(`${file}:${i + 1}`, `needs two numbers (R and the value), got ${JSON.stringify(line)}`);
    const r = Number(cols[0]), v = Number(cols[1]);
    if (!Number.isFinite(r) || !Number.isFinite(v)) throw new InputError(`${file}:${i + 1}`, `R and the value must be finite numbers, got ${JSON.stringify(line)}`);
    if (R.length > 0 && !(r * toBohr > R[R.length - 1])) throw new InputError(`${file}:${i + 1}`, `the R grid must increase strictly, got ${r} after ${R[R.length - 1] / toBohr}`);
    R.push(r * toBohr);
    values.push(v * scale);
  });
  if (R.length < 4) throw new InputError(file, `a table needs at least 4 data lines, got ${R.length}`);
  return { R, values };
}

/** Dipole unit → e·a0. */
export const DIPOLE_TO_AU: Readonly<Record<'au' | 'debye', number>> = { au: 1, debye: 1 / DIPOLE_AU_IN_DEBYE };

/**
 * Parse a --spectrum range "FROM:TO:STEP" (cm^-1).
 */
export function parseSpectrumRange(text: string, field = '--spectrum'): { from: number; to: number; step: number } {
  const parts = text.split(':');
  if (parts.length !== 3) throw new InputError(field, `must be FROM:TO:STEP in cm^-1 (e.g. 0:400:1), got ${JSON.stringify(text)}`);
  const [from, to, step] = parts.map((p, i) => requireFinite(`${field}.${['from', 'to', 'step'][i]}`, p));
  return { from, to, step };
}
