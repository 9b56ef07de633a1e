/**
 * Species from user response data: either alpha(iu) (and B(0; iu, −iu)) tabulated on a grid of imaginary
 * frequencies, or a dipole pseudo-spectrum (excitation energies and oscillator strengths) plus a static B.
 * Such species have response functions only (no state space), so only the response route can use them.
 *
 * Text format (our own; comma-separated values, one header line naming columns and units):
 *
 *   # comments start with '#' (also after blanks at the end of a line)
 *   name = Mystery              ← optional settings (key = value) before the header
 *   electrons = 10              ← electron number N: the tail alpha ~ N/u² beyond the grid
 *   B = -18.2                   ← static B (Buckingham, atomic units), when there is no B column
 *   u [Eh], alpha [a0^3], B [au]           ← table: u and alpha required; alpha2 [a0^5], alpha3 [a0^7], B optional
 *   0, 2.66, -18.2
 *   …
 * or, for a pseudo-spectrum, the header `energy [Eh], strength` (alpha(iu) = Σ f_i/(ω_i² + u²)).
 * Units: u and energy in Eh or eV; alpha in a0^3 or A^3 (ångström³); alpha2, alpha3, B in atomic units.
 * Bad data raise an InputError whose field is `file:line:column` (line and column counted from 1).
 * Pure: takes the text; the CLI reads the file.
 */
import { InputError, describeValue } from './errors.js';
import { BOHR_IN_ANGSTROM, HARTREE_IN_EV } from './units.js';

/** alpha(iu) (and optionally alpha_2, alpha_3, B(0; iu, −iu)) tabulated on a grid of u. Atomic units. */
export interface ResponseTableSpecies {
  kind: 'response-table';
  name: string;
  /** Imaginary frequencies u, hartree, strictly increasing from 0. */
  u: number[];
  /** alpha_1(iu), a0³. */
  alpha: number[];
  /** Quadrupole polarisability alpha_2(iu), a0⁵ (enables C8). */
  alpha2?: number[];
  /** Octupole polarisability alpha_3(iu), a0⁷ (with alpha2, enables C10). */
  alpha3?: number[];
  /** B(0; iu, −iu) on the grid (Buckingham normalisation), atomic units. */
  hyperB?: number[];
  /** Static B, used as B(0; iu, −iu) ≈ B alpha(iu)/alpha(0) when there is no B column (approximate). */
  staticB?: number;
  /** Electron number N (large-u tail alpha ~ N/u²). */
  electrons?: number;
  source?: string;
  /** A short form of `source` for one-line reports, when the full one runs to several lines (recommended atoms). */
  sourceBrief?: string;
}

/** A dipole pseudo-spectrum: alpha(iu) = Σ f_i / (ω_i² + u²), plus a static B. Atomic units. */
export interface OscillatorSpectrumSpecies {
  kind: 'oscillator-spectrum';
  name: string;
  /** Excitation energies ω_i, hartree (> 0). */
  energies: number[];
  /** Dipole oscillator strengths f_i (> 0). */
  strengths: number[];
  /** Static B (Buckingham, atomic units); B(0; iu, −iu) ≈ B alpha(iu)/alpha(0) (approximate). */
  staticB: number;
  /** Electron number N, compared with the sum rule Σ f_i = N. */
  electrons?: number;
  source?: string;
}

export type ResponseDataSpecies = ResponseTableSpecies | OscillatorSpectrumSpecies;

interface ColumnSpec {
  units: Record<string, number>;
}

const ENERGY_UNITS = { Eh: 1, hartree: 1, eV: 1 / HARTREE_IN_EV };
const VOLUME_UNITS = { 'a0^3': 1, 'bohr^3': 1, 'A^3': BOHR_IN_ANGSTROM ** -3, 'Å^3': BOHR_IN_ANGSTROM ** -3 };
const TABLE_COLUMNS: Record<string, ColumnSpec> = {
  u: { units: ENERGY_UNITS },
  alpha: { units: VOLUME_UNITS },
  alpha2: { units: { 'a0^5': 1, au: 1 } },
  alpha3: { units: { 'a0^7': 1, au: 1 } },
  B: { units: { au: 1 } },
};
const SPECTRUM_COLUMNS: Record<string, ColumnSpec> = {
  energy: { units: ENERGY_UNITS },
  strength: { units: { '': 1, '1': 1 } },
};
const SETTINGS = ['name', 'electrons', 'B', 'source'] as const;
const TABLE_MIN_ROWS = 6;
/**
 * Largest number of data rows (tables and pseudo-spectra). alpha(iu) is smooth: published tables use 10 to 100
 * frequencies (common practice), and the rational interpolation's cost grows with the square of the rows.
 */
export const RESPONSE_DATA_MAX_ROWS = 2000;

/**
 * Largest |log10| of a response value (and of the derived static alpha of a pseudo-spectrum): 10^±100 keeps the
 * C_n and D7 integrals, products of two species' values, within double precision (about 10^±308).
 */
export const RESPONSE_VALUE_LOG10_LIMIT = 100;

/** A value within 10^±{@link RESPONSE_VALUE_LOG10_LIMIT} (or 0), else an InputError naming `field`. */
function requireModerate(field: string, what: string, x: number): number {
  const size = Math.abs(x);
  if (size === 0 || (size <= 10 ** RESPONSE_VALUE_LOG10_LIMIT && size >= 10 ** -RESPONSE_VALUE_LOG10_LIMIT)) return x;
  throw new InputError(field, `${what} = ${x} is beyond the range 1e±${RESPONSE_VALUE_LOG10_LIMIT} this program computes in (values of this size overflow the coefficients)`);
}

/** alpha(0) = Σ f_i/ω_i² of a pseudo-spectrum, a0³. */
const staticSpectrumAlpha = (energies: readonly number[], strengths: readonly number[]) => energies.reduce((s, e, i) => s + strengths[i] / (e * e), 0);

/** The species named in a response-data file (name setting, else the file's base name without extension). */
export function parseResponseData(text: string, fileName: string): ResponseDataSpecies {
  const lines = text.split(/\r?\n/);
  const at = (line: number, col?: number) => `${fileName}:${line}${col !== undefined ? `:${col}` : ''}`;
  const settings: Record<string, { value: string; line: number }> = {};
  let header: { cells: string[]; line: number } | undefined;
  const rows: Array<{ cells: string[]; line: number }> = [];
  lines.forEach((raw, i) => {
    const line = raw.trim().replace(/\s+#.*$/, ''); // a '#' after blanks starts a trailing comment
    if (line === '' || line.startsWith('#')) return;
    if (!header) {
      const eq = line.indexOf('=');
      if (eq > 0 && !line.includes(',')) {
        const key = line.slice(0, eq).trim();
        if (!(SETTINGS as readonly string[]).includes(key)) {
          throw new InputError(at(i + 1, 1), `unknown setting ${JSON.stringify(key)}; allowed settings: ${SETTINGS.join(', ')}`);
        }
        if (key in settings) throw new InputError(at(i + 1, 1), `setting ${key} is given twice`);
        settings[key] = { value: line.slice(eq + 1).trim(), line: i + 1 };
        return;
      }
      header = { cells: splitCells(line), line: i + 1 };
      return;
    }
    if (rows.length >= RESPONSE_DATA_MAX_ROWS) {
      throw new InputError(at(i + 1), `has more than ${RESPONSE_DATA_MAX_ROWS} data rows, the limit for response data (alpha(iu) is smooth: 10 to 100 frequencies are plenty)`);
    }
    rows.push({ cells: splitCells(line), line: i + 1 });
  });
  if (!header) throw new InputError(fileName, 'has no header line; expected e.g. "u [Eh], alpha [a0^3], B [au]" or "energy [Eh], strength"');

  const labels = header.cells.map((c) => parseHeaderCell(c));
  const isTable = labels.some((l) => l.label === 'u');
  const isSpectrum = labels.some((l) => l.label === 'energy');
  if (isTable === isSpectrum) {
    throw new InputError(
      at(header.line, 1),
      'the header must name either a u column (tabulated alpha(iu): "u [Eh], alpha [a0^3], …") or an energy column (pseudo-spectrum: "energy [Eh], strength"), not both or neither',
    );
  }
  const allowed = isTable ? TABLE_COLUMNS : SPECTRUM_COLUMNS;
  const factors = new Map<string, number>();
  labels.forEach(({ label, unit }, c) => {
    const where = at(header!.line, c + 1);
    const spec = Object.prototype.hasOwnProperty.call(allowed, label) ? allowed[label] : undefined;
    if (!spec) throw new InputError(where, `unknown column ${JSON.stringify(label)}; allowed columns: ${Object.keys(allowed).join(', ')}`);
    if (factors.has(label)) throw new InputError(where, `column ${label} appears twice`);
    if (!Object.prototype.hasOwnProperty.call(spec.units, unit)) {
      const units = Object.keys(spec.units).filter((u) => u !== '');
      throw new InputError(where, `column ${label} needs a unit in brackets, one of: ${units.length ? units.join(', ') : '(none)'}; got ${JSON.stringify(unit)}`);
    }
    factors.set(label, spec.units[unit]);
  });
  const required = isTable ? ['u', 'alpha'] : ['energy', 'strength'];
  for (const r of required) {
    if (!factors.has(r)) {
      const example = isTable ? 'u [Eh], alpha [a0^3]' : 'energy [Eh], strength';
      throw new InputError(at(header.line, labels.length + 1), `missing column ${r} (the header needs at least: ${example})`);
    }
  }

  const columns = new Map<string, number[]>([...factors.keys()].map((k) => [k, []]));
  for (const row of rows) {
    if (row.cells.length !== labels.length) {
      throw new InputError(at(row.line, Math.min(row.cells.length, labels.length) + 1), `has ${row.cells.length} values, the header has ${labels.length} columns`);
    }
    row.cells.forEach((cell, c) => {
      const x = Number(cell);
      if (cell === '' || !Number.isFinite(x)) {
        throw new InputError(at(row.line, c + 1), `${labels[c].label} must be a finite number, got ${describeValue(cell)}`);
      }
      columns.get(labels[c].label)!.push(requireModerate(at(row.line, c + 1), labels[c].label, x * factors.get(labels[c].label)!));
    });
  }
  const colOf = (label: string) => labels.findIndex((l) => l.label === label) + 1;

  const setting = (key: string) => settings[key];
  const numberSetting = (key: string, positive: boolean): number | undefined => {
    const s = setting(key);
    if (!s) return undefined;
    const x = Number(s.value);
    if (s.value === '' || !Number.isFinite(x) || (positive && !(x > 0))) {
      throw new InputError(at(s.line, 1), `setting ${key} must be a finite number${positive ? ' > 0' : ''}, got ${describeValue(s.value)}`);
    }
    return requireModerate(at(s.line, 1), `setting ${key}`, x);
  };
  const name = setting('name')?.value || baseName(fileName);
  const electrons = numberSetting('electrons', true);
  const staticB = numberSetting('B', false);
  const source = setting('source')?.value;
  const common = {
    name,
    ...(electrons !== undefined ? { electrons } : {}),
    ...(source ? { source } : { source: `user data from ${fileName}` }),
  };

  if (isSpectrum) {
    if (rows.length === 0) throw new InputError(at(header.line + 1), 'the pseudo-spectrum has no lines');
    const energies = columns.get('energy')!, strengths = columns.get('strength')!;
    rows.forEach((row, k) => {
      if (!(energies[k] > 0)) throw new InputError(at(row.line, colOf('energy')), `energy must be > 0, got ${energies[k]}`);
      if (!(strengths[k] > 0)) throw new InputError(at(row.line, colOf('strength')), `strength must be > 0, got ${strengths[k]}`);
    });
    if (staticB === undefined) {
      throw new InputError(at(header.line), 'a pseudo-spectrum needs the static hyperpolarisability: add a setting line "B = <value in atomic units>" before the header');
    }
    requireModerate(at(header.line), 'the static alpha = Σ f/ω²', staticSpectrumAlpha(energies, strengths));
    return { kind: 'oscillator-spectrum', ...common, energies, strengths, staticB };
  }

  if (rows.length < TABLE_MIN_ROWS) {
    throw new InputError(at(rows.length ? rows[rows.length - 1].line : header.line), `a table needs at least ${TABLE_MIN_ROWS} rows for interpolation, got ${rows.length}`);
  }
  const u = columns.get('u')!, alpha = columns.get('alpha')!;
  rows.forEach((row, k) => {
    if (k === 0 && u[0] !== 0) throw new InputError(at(row.line, colOf('u')), `the grid must start at u = 0 (the static limit), got ${u[0]}`);
    if (k > 0 && !(u[k] > u[k - 1])) {
      throw new InputError(at(row.line, colOf('u')), `the u grid must increase strictly: ${u[k]} follows ${u[k - 1]}`);
    }
    for (const label of ['alpha', 'alpha2', 'alpha3'] as const) {
      const col = columns.get(label);
      if (col && !(col[k] > 0)) throw new InputError(at(row.line, colOf(label)), `${label} must be > 0 (a polarisability at imaginary frequency is positive), got ${col[k]}`);
    }
    if (k > 0 && alpha[k] > alpha[k - 1] * (1 + 1e-12)) {
      throw new InputError(at(row.line, colOf('alpha')), `alpha(iu) must not increase with u (it is Σ f/(ω² + u²)): ${alpha[k]} follows ${alpha[k - 1]}`);
    }
  });
  const hyperB = columns.get('B');
  if (hyperB && staticB !== undefined) {
    throw new InputError(at(setting('B')!.line, 1), 'give B either as a column "B [au]" (B(0; iu, −iu) on the grid) or as the static setting "B = …", not both');
  }
  if (!hyperB && staticB === undefined) {
    throw new InputError(
      at(header.line, labels.length + 1),
      'missing column B: give B(0; iu, −iu) as a column "B [au]", or a static B as a setting line "B = <value>" (then D7 is approximate)',
    );
  }
  const alpha2 = columns.get('alpha2'), alpha3 = columns.get('alpha3');
  if (alpha3 && !alpha2) throw new InputError(at(header.line, colOf('alpha3')), 'alpha3 needs an alpha2 column as well (C10 uses both)');
  return {
    kind: 'response-table',
    ...common,
    u,
    alpha,
    ...(alpha2 ? { alpha2 } : {}),
    ...(alpha3 ? { alpha3 } : {}),
    ...(hyperB ? { hyperB } : {}),
    ...(staticB !== undefined ? { staticB } : {}),
  };
}

/** True when a species file name looks like response data (CSV) rather than a species file (YAML/JSON). */
export const isResponseDataFile = (fileName: string): boolean => /\.csv$/i.test(fileName);

/** A response-data file as a one-entry species map (the shape species files give). */
export function responseDataSpeciesFile(text: string, fileName: string): Map<string, ResponseDataSpecies> {
  const s = parseResponseData(text, fileName);
  return new Map([[s.name, s]]);
}

/**
 * A pseudo-spectrum species from plain fields (species files): energies and strengths as lists, B, electrons.
 * Errors name the entry and index, e.g. `Mystery.energies[2]`.
 */
export function oscillatorSpectrum(
  fields: { energies?: unknown; strengths?: unknown; B?: unknown; electrons?: unknown },
  name: string,
  source?: string,
): OscillatorSpectrumSpecies {
  const list = (key: 'energies' | 'strengths'): number[] => {
    const v = fields[key];
    if (!Array.isArray(v) || v.length === 0) throw new InputError(`${name}.${key}`, `must be a non-empty list of numbers > 0, got ${describeValue(v)}`);
    if (v.length > RESPONSE_DATA_MAX_ROWS) throw new InputError(`${name}.${key}`, `has ${v.length} values; the limit is ${RESPONSE_DATA_MAX_ROWS}`);
    return v.map((x, i) => {
      const n = typeof x === 'string' && x.trim() !== '' ? Number(x) : x;
      if (typeof n !== 'number' || !(n > 0) || !Number.isFinite(n)) throw new InputError(`${name}.${key}[${i}]`, `must be a finite number > 0, got ${describeValue(x)}`);
      return n;
    });
  };
  const energies = list('energies').map((x, i) => requireModerate(`${name}.energies[${i}]`, 'energy', x));
  const strengths = list('strengths').map((x, i) => requireModerate(`${name}.strengths[${i}]`, 'strength', x));
  if (energies.length !== strengths.length) {
    throw new InputError(`${name}.strengths`, `must have one value per energy (${energies.length}), got ${strengths.length}`);
  }
  const B = typeof fields.B === 'string' ? Number(fields.B) : fields.B;
  if (typeof B !== 'number' || !Number.isFinite(B)) throw new InputError(`${name}.B`, `must be a finite number (static B, atomic units), got ${describeValue(fields.B)}`);
  requireModerate(`${name}.B`, 'B', B);
  requireModerate(`${name}.energies`, 'the static alpha = Σ f/ω²', staticSpectrumAlpha(energies, strengths));
  let electrons: number | undefined;
  if (fields.electrons !== undefined) {
    const e = typeof fields.electrons === 'string' ? Number(fields.electrons) : fields.electrons;
    if (typeof e !== 'number' || !(e > 0) || !Number.isFinite(e)) throw new InputError(`${name}.electrons`, `must be a finite number > 0, got ${describeValue(fields.electrons)}`);
    electrons = e;
  }
  return {
    kind: 'oscillator-spectrum',
    name,
    energies,
    strengths,
    staticB: B,
    ...(electrons !== undefined ? { electrons } : {}),
    ...(source ? { source } : {}),
  };
}

/** Response data given inline in a species file (`data: |` with the text format above). */
export function responseDataFromText(text: unknown, name: string, source?: string): ResponseDataSpecies {
  if (typeof text !== 'string' || text.trim() === '') throw new InputError(`${name}.data`, 'must be the response-data text (header line and rows)');
  const s = parseResponseData(text, `${name}.data`);
  return { ...s, name, ...(source ? { source } : {}) };
}

/** "label [unit]" → label and unit ("" when there are no brackets). */
function parseHeaderCell(cell: string): { label: string; unit: string } {
  const m = /^([^[\]]*?)\s*(?:\[([^\]]*)\])?$/.exec(cell.trim());
  if (!m) return { label: cell.trim(), unit: '?' };
  return { label: m[1].trim(), unit: (m[2] ?? '').trim() };
}

function splitCells(line: string): string[] {
  return line.split(',').map((c) => c.trim());
}

function baseName(path: string): string {
  const file = path.split(/[\\/]/).pop() ?? path;
  return file.replace(/\.[^.]*$/, '') || file;
}
