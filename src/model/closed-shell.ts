/**
 * A closed-shell atom or ion computed from first principles: restricted Hartree–Fock ground state and
 * time-dependent (coupled) Hartree–Fock response (src/engines/atoms/hartree-fock/). Plain data; atomic units.
 * Inline spec: `tdhf:He`, `tdhf:Z=18`, `tdhf:Z=11,charge=1`, `tdhf:Ar,basis=24`.
 */
import { InputError, describeValue } from './errors.js';
import { requireIntegerIn } from './validate.js';

/*
 * Closed-shell ground configurations the Hartree–Fock engine treats: the number of doubly occupied shells in each
 * angular-momentum channel, by electron number (aufbau order 1s 2s 2p 3s 3p 4s 3d 4p 5s 4d 5p 6s; common practice).
 * One electron (hydrogen-like) is the single spin-orbital case used to check the response machinery.
 */

/** Element symbols by nuclear charge (index Z − 1), H … Rn. */
export const ELEMENT_SYMBOLS = [
  'H', 'He', 'Li', 'Be', 'B', 'C', 'N', 'O', 'F', 'Ne', 'Na', 'Mg', 'Al', 'Si', 'P', 'S', 'Cl', 'Ar', 'K', 'Ca',
  'Sc', 'Ti', 'V', 'Cr', 'Mn', 'Fe', 'Co', 'Ni', 'Cu', 'Zn', 'Ga', 'Ge', 'As', 'Se', 'Br', 'Kr', 'Rb', 'Sr', 'Y', 'Zr',
  'Nb', 'Mo', 'Tc', 'Ru', 'Rh', 'Pd', 'Ag', 'Cd', 'In', 'Sn', 'Sb', 'Te', 'I', 'Xe', 'Cs', 'Ba', 'La', 'Ce', 'Pr', 'Nd',
  'Pm', 'Sm', 'Eu', 'Gd', 'Tb', 'Dy', 'Ho', 'Er', 'Tm', 'Yb', 'Lu', 'Hf', 'Ta', 'W', 'Re', 'Os', 'Ir', 'Pt', 'Au', 'Hg',
  'Tl', 'Pb', 'Bi', 'Po', 'At', 'Rn',
] as const;

/** Closed-shell configurations: electron number → occupied shells per l (s, p, d) and the configuration text. */
export const CLOSED_SHELLS: Readonly<Record<number, { shells: readonly number[]; text: string }>> = {
  1: { shells: [1], text: '1s (one electron)' },
  2: { shells: [1], text: '1s²' },
  4: { shells: [2], text: '1s² 2s²' },
  10: { shells: [2, 1], text: '[He] 2s² 2p⁶' },
  12: { shells: [3, 1], text: '[Ne] 3s²' },
  18: { shells: [3, 2], text: '[Ne] 3s² 3p⁶' },
  20: { shells: [4, 2], text: '[Ar] 4s²' },
  28: { shells: [3, 2, 1], text: '[Ar] 3d¹⁰' },
  30: { shells: [4, 2, 1], text: '[Ar] 3d¹⁰ 4s²' },
  36: { shells: [4, 3, 1], text: '[Ar] 3d¹⁰ 4s² 4p⁶' },
  38: { shells: [5, 3, 1], text: '[Kr] 5s²' },
  46: { shells: [4, 3, 2], text: '[Kr] 4d¹⁰' },
  48: { shells: [5, 3, 2], text: '[Kr] 4d¹⁰ 5s²' },
  54: { shells: [5, 4, 2], text: '[Kr] 4d¹⁰ 5s² 5p⁶' },
  56: { shells: [6, 4, 2], text: '[Xe] 6s²' },
};

/** Electron numbers with a closed-shell configuration, ascending. */
export const CLOSED_SHELL_ELECTRONS = Object.keys(CLOSED_SHELLS).map(Number).sort((a, b) => a - b);

/** Element symbol → nuclear charge, or undefined. */
export function nuclearCharge(symbol: string): number | undefined {
  const i = (ELEMENT_SYMBOLS as readonly string[]).indexOf(symbol);
  return i < 0 ? undefined : i + 1;
}

/** Default number of Slater functions per angular momentum. */
export const DEFAULT_TDHF_BASIS = 20;
/** Allowed basis sizes (below 12 the heavier atoms' SCF energies are off by more than 1e-4 Eh; above 32 the set is near-linearly dependent). */
export const TDHF_BASIS_RANGE = [12, 32] as const;

export interface TdhfSpecies {
  kind: 'tdhf';
  /** Display name (the inline spec or a file entry's name). */
  name: string;
  /** Element symbol of the nucleus. */
  symbol: string;
  /** Nuclear charge. */
  Z: number;
  /** Net charge (electrons = Z − charge, a closed-shell count). */
  charge: number;
  /** Slater functions per angular momentum. */
  basis: number;
  source?: string;
}

/** Highest nuclear charge with an element symbol here (Rn). */
export const TDHF_Z_MAX = ELEMENT_SYMBOLS.length;

const allowedCounts = (): string =>
  CLOSED_SHELL_ELECTRONS.map((n) => `${n} (${CLOSED_SHELLS[n].text})`).join(', ');

/**
 * A closed-shell species; fields validated: `element` (symbol) or `Z` (integer 1 … 86), optional `charge`
 * (integer, default 0) such that Z − charge is a closed-shell electron count, optional `basis`.
 */
export function tdhfSpecies(params: { element?: unknown; Z?: unknown; charge?: unknown; basis?: unknown }, name = 'tdhf', source?: string): TdhfSpecies {
  let Z: number;
  if (params.element !== undefined) {
    const z = typeof params.element === 'string' ? nuclearCharge(params.element.trim()) : undefined;
    if (z === undefined) throw new InputError(`${name}.element`, `unknown element ${describeValue(params.element)}; give a symbol H … Rn (e.g. He, Ar) or Z=…`);
    if (params.Z !== undefined && Number(params.Z) !== z) throw new InputError(`${name}.Z`, `contradicts element ${String(params.element)} (Z = ${z})`);
    Z = z;
  } else if (params.Z !== undefined) {
    Z = requireIntegerIn(`${name}.Z`, params.Z, 1, TDHF_Z_MAX);
  } else {
    throw new InputError(`${name}.element`, 'is missing (give an element symbol, e.g. tdhf:He, or Z=…)');
  }
  const charge = params.charge === undefined ? 0 : requireIntegerIn(`${name}.charge`, params.charge, -2, Z - 1);
  const electrons = Z - charge;
  if (!CLOSED_SHELLS[electrons]) {
    throw new InputError(
      `${name}.${params.charge === undefined ? (params.element !== undefined ? 'element' : 'Z') : 'charge'}`,
      `${ELEMENT_SYMBOLS[Z - 1]}${charge ? ` with charge ${charge}` : ''} has ${electrons} electrons, an open shell this engine cannot treat; ` +
        `allowed electron counts (closed shells): ${allowedCounts()} — e.g. He, Be, Ne, Mg, Ar, Ca, Zn, Kr, Sr, Cd, Xe, Ba, or ions such as Li+ (Z=3,charge=1), Na+ (Z=11,charge=1)`,
    );
  }
  const basis = params.basis === undefined ? DEFAULT_TDHF_BASIS : requireIntegerIn(`${name}.basis`, params.basis, TDHF_BASIS_RANGE[0], TDHF_BASIS_RANGE[1]);
  return { kind: 'tdhf', name, symbol: ELEMENT_SYMBOLS[Z - 1], Z, charge, basis, ...(source ? { source } : {}) };
}

/** One-line description (atomic units). */
export function describeTdhf(s: TdhfSpecies): string {
  const ion = s.charge === 0 ? '' : `, charge ${s.charge > 0 ? '+' : ''}${s.charge}`;
  return `time-dependent Hartree–Fock ${s.symbol} (Z=${s.Z}${ion}, ${CLOSED_SHELLS[s.Z - s.charge].text}), basis=${s.basis} Slater functions per l`;
}
