/**
 * Builders that turn a kind name and a record of fields (from an inline spec or a species file) into a
 * validated {@link Species}. One entry per kind; each names its fields so errors can list them.
 */
import { drude, drudeAnisotropic, drudeFromTargets } from './drude.js';
import { InputError } from './errors.js';
import { DEFAULT_HYDROGENIC_BASIS, hydrogenic } from './hydrogenic.js';
import { DEFAULT_TDHF_BASIS, tdhfSpecies } from './closed-shell.js';
import { oscillatorSpectrum, responseDataFromText } from './response-data.js';
import type { Species } from './species.js';

/** A kind's builder: `fields` are raw values (numbers or numeric strings); `name` is used in messages. */
export interface SpeciesKind {
  /** Short description shown in help and errors. */
  summary: string;
  /** Allowed field names (the builder checks which combination is present). */
  fields: readonly string[];
  /** Field a bare first value of an inline spec fills (e.g. `tdhf:He` means element=He). */
  positional?: string;
  build(fields: Record<string, unknown>, name: string, source?: string): Species;
}

export const speciesKinds: Record<string, SpeciesKind> = {
  drude: {
    summary: 'quantum Drude oscillator: q, m and w (isotropic) or wx, wy, wz (anisotropic), atomic units',
    fields: ['q', 'm', 'w', 'wx', 'wy', 'wz'],
    build(f, name, source) {
      const hasIso = f.w !== undefined;
      const hasAniso = f.wx !== undefined || f.wy !== undefined || f.wz !== undefined;
      if (hasIso && hasAniso) throw new InputError(`${name}`, 'give either w or all of wx, wy, wz, not both');
      if (!hasIso && !hasAniso) throw new InputError(`${name}.w`, 'is missing (give w, or wx, wy and wz)');
      if (hasIso) return drude({ q: f.q as number, m: f.m as number, w: f.w as number }, name, source);
      return drudeAnisotropic(
        { q: f.q as number, m: f.m as number, wx: f.wx as number, wy: f.wy as number, wz: f.wz as number },
        name,
        source,
      );
    },
  },
  fit: {
    summary: 'isotropic Drude oscillator fitted to alpha, C6 and C8 of the like pair (atomic units)',
    fields: ['alpha', 'C6', 'C8'],
    build(f, name, source) {
      return drudeFromTargets({ alpha: f.alpha as number, C6: f.C6 as number, C8: f.C8 as number }, name, source);
    },
  },
  hydrogenic: {
    summary: `hydrogen-like atom computed from first principles: Z (nuclear charge, default 1), basis (Sturmian functions per l, default ${DEFAULT_HYDROGENIC_BASIS})`,
    fields: ['Z', 'basis'],
    build(f, name, source) {
      return hydrogenic({ Z: f.Z, basis: f.basis }, name, source);
    },
  },
  tdhf: {
    summary: `closed-shell atom or ion from first principles (time-dependent Hartree–Fock): element symbol or Z, optional charge, basis (Slater functions per l, default ${DEFAULT_TDHF_BASIS}); e.g. tdhf:He, tdhf:Z=11,charge=1`,
    fields: ['element', 'Z', 'charge', 'basis'],
    positional: 'element',
    build(f, name, source) {
      return tdhfSpecies({ element: f.element, Z: f.Z, charge: f.charge, basis: f.basis }, name, source);
    },
  },
  spectrum: {
    summary: 'dipole pseudo-spectrum (species files): lists energies (Eh) and strengths, static B, optional electrons; response route only, D7 approximate',
    fields: ['energies', 'strengths', 'B', 'electrons'],
    build(f, name, source) {
      return oscillatorSpectrum(f, name, source);
    },
  },
  table: {
    summary: 'tabulated alpha(iu) and B(0;iu,-iu) (species files): data = the response-data text (see README); response route only',
    fields: ['data'],
    build(f, name, source) {
      return responseDataFromText(f.data, name, source);
    },
  },
};

/** Build a species of `kind` from raw fields, rejecting unknown kinds and unknown field names. */
export function buildSpecies(kind: string, fields: Record<string, unknown>, name: string, source?: string): Species {
  const k = Object.prototype.hasOwnProperty.call(speciesKinds, kind) ? speciesKinds[kind] : undefined;
  if (!k) {
    throw new InputError(`${name}.kind`, `unknown kind ${JSON.stringify(kind)}; known kinds: ${Object.keys(speciesKinds).join(', ')}`);
  }
  for (const key of Object.keys(fields)) {
    if (!k.fields.includes(key)) {
      throw new InputError(`${name}.${key}`, `is not a field of kind ${kind}; allowed: ${k.fields.join(', ')}`);
    }
  }
  return k.build(fields, name, source);
}

/**
 * Parse an inline spec `kind:key=value,key=value`, e.g. `drude:q=1.2,m=0.4,w=0.9` or
 * `drude:q=1,m=1,wx=0.8,wy=0.8,wz=1.1` or `fit:alpha=1.38,C6=1.46,C8=14.1`.
 */
export function parseInlineSpecies(spec: string): Species {
  const colon = spec.indexOf(':');
  if (colon < 0) throw new InputError(spec.trim() === '' ? 'species' : spec, `${spec.trim() === '' ? 'is empty; ' : ''}an inline species needs the form kind:key=value,…`);
  const kind = spec.slice(0, colon).trim();
  const body = spec.slice(colon + 1).trim();
  // null prototype: a key such as __proto__ or constructor is an ordinary (unknown) field name, nothing inherited
  const fields: Record<string, unknown> = Object.create(null) as Record<string, unknown>;
  if (body !== '') {
    const positional = Object.prototype.hasOwnProperty.call(speciesKinds, kind) ? speciesKinds[kind].positional : undefined;
    for (const [index, part] of body.split(',').entries()) {
      const eq = part.indexOf('=');
      if (eq < 0 && index === 0 && positional) {
        fields[positional] = part.trim();
        continue;
      }
      if (eq < 0) throw new InputError(`${spec}`, `expected key=value, got ${JSON.stringify(part)}`);
      const key = part.slice(0, eq).trim();
      const raw = part.slice(eq + 1).trim();
      if (Object.hasOwn(fields, key)) throw new InputError(`${spec}.${key}`, 'is given twice');
      const value = Number(raw);
      fields[key] = raw === '' ? raw : Number.isNaN(value) ? raw : value;
    }
  }
  return buildSpecies(kind, fields, spec);
}
