/**
 * The symbols of a symbolic pair derivation: each species' charge q, mass m and frequencies w (one, or one per
 * lab axis), its polarisability alpha = q²/(m w²) (isotropic only), the distance R, and one internal ladder
 * length s per (mass, frequency) with s² = 1/(2 m w) (the harmonic-oscillator length, x = s (a + a†)).
 * Every monomial in the symbolic engine is an exponent vector over one {@link SymbolTable}.
 *
 * Layouts: two different species (qa, ma, wa, qb, mb, wb) or one species on both centres (q, m, w);
 * isotropic (w) or anisotropic with frequencies along the lab axes (wx, wy, wz).
 */

/** Which pair the derivation is for. */
export interface PairLayout {
  /** The same species on both centres (symbols without a/b suffix). */
  identical: boolean;
  /** Frequencies along the lab axes (wx, wy, wz) instead of one frequency. */
  anisotropic: boolean;
}

export type SymbolRole = 'q' | 'm' | 'w' | 'alpha' | 'R' | 's';
export type Centre = 'a' | 'b';

export interface SymbolInfo {
  /** Plain-text name, as typed in expressions (e.g. `qa`, `wbz`, `alpha`). */
  name: string;
  /** LaTeX (e.g. `q_a`, `\omega_{b,z}`). */
  latex: string;
  role: SymbolRole;
  /** The species it belongs to (none for R, and for the one species of an identical pair). */
  centre?: Centre;
  /** What it is, for help and JSON. */
  meaning: string;
}

export interface SymbolTable {
  layout: PairLayout;
  symbols: readonly SymbolInfo[];
  /** Symbol index of q, m, alpha (alpha −1 when anisotropic) per centre. */
  q: Record<Centre, number>;
  m: Record<Centre, number>;
  alpha: Record<Centre, number>;
  /** Symbol index of the frequency along x, y, z per centre (all three equal when isotropic). */
  w: Record<Centre, readonly [number, number, number]>;
  /** Symbol index of the ladder length s along x, y, z per centre (internal; never printed). */
  s: Record<Centre, readonly [number, number, number]>;
  /** Index of the distance R. */
  R: number;
  /** Index of a name, or undefined. */
  indexOf(name: string): number | undefined;
  /** For an s symbol: the m and w it stands for (s² = 1/(2 m w)). */
  ladderOf(sIndex: number): { m: number; w: number } | undefined;
  /** The indices of the symbols an expression may use for the species (not s; alpha only when isotropic). */
  parameterIndices: readonly number[];
}

const AXES = ['x', 'y', 'z'] as const;

const cache = new Map<string, SymbolTable>();

/** The symbol table of a layout (cached: the same layout gives the same object). */
export function symbolTable(layout: PairLayout): SymbolTable {
  const key = `${layout.identical}/${layout.anisotropic}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const symbols: SymbolInfo[] = [];
  const byName = new Map<string, number>();
  const add = (info: SymbolInfo): number => {
    const existing = byName.get(info.name);
    if (existing !== undefined) return existing;
    symbols.push(info);
    byName.set(info.name, symbols.length - 1);
    return symbols.length - 1;
  };
  const centres: Centre[] = ['a', 'b'];
  const suffix = (c: Centre) => (layout.identical ? '' : c);
  const sub = (c: Centre, axis?: string) => {
    const parts = [layout.identical ? '' : c, axis ?? ''].filter(Boolean);
    return parts.length === 0 ? '' : parts.length === 1 ? `_${parts[0]}` : `_{${parts.join(',')}}`;
  };
  const who = (c: Centre) => (layout.identical ? 'each species' : c === 'a' ? 'species A' : 'species B');
  const of = (c: Centre) => (layout.identical ? {} : { centre: c });

  const q = {} as Record<Centre, number>;
  const m = {} as Record<Centre, number>;
  const alpha = {} as Record<Centre, number>;
  const w = {} as Record<Centre, readonly [number, number, number]>;
  for (const c of centres) {
    q[c] = add({ name: `q${suffix(c)}`, latex: `q${sub(c)}`, role: 'q', ...of(c), meaning: `Drude charge of ${who(c)} (e)` });
    m[c] = add({ name: `m${suffix(c)}`, latex: `m${sub(c)}`, role: 'm', ...of(c), meaning: `Drude mass of ${who(c)} (m_e)` });
  }
  for (const c of centres) {
    if (layout.anisotropic) {
      w[c] = AXES.map((ax) =>
        add({ name: `w${suffix(c)}${ax}`, latex: `\\omega${sub(c, ax)}`, role: 'w', ...of(c), meaning: `frequency of ${who(c)} along ${ax} (Eh/hbar)` }),
      ) as unknown as [number, number, number];
      alpha[c] = -1;
    } else {
      const i = add({ name: `w${suffix(c)}`, latex: `\\omega${sub(c)}`, role: 'w', ...of(c), meaning: `frequency of ${who(c)} (Eh/hbar)` });
      w[c] = [i, i, i];
    }
  }
  if (!layout.anisotropic) {
    for (const c of centres) {
      alpha[c] = add({
        name: `alpha${suffix(c)}`,
        latex: `\\alpha${sub(c)}`,
        role: 'alpha',
        ...of(c),
        meaning: `static polarisability of ${who(c)}, q²/(m w²) (a0³)`,
      });
    }
  }
  const R = add({ name: 'R', latex: 'R', role: 'R', meaning: 'distance from A to B (a0)' });
  const s = {} as Record<Centre, readonly [number, number, number]>;
  const ladder = new Map<number, { m: number; w: number }>();
  for (const c of centres) {
    s[c] = [0, 1, 2].map((axis) => {
      const wi = w[c][axis];
      const i = add({ name: `@s:${symbols[m[c]].name}:${symbols[wi].name}`, latex: 's', role: 's', meaning: 'internal ladder length' });
      ladder.set(i, { m: m[c], w: wi });
      return i;
    }) as unknown as [number, number, number];
  }
  const parameterIndices = [
    ...new Set([...centres.flatMap((c) => [q[c], m[c], ...w[c]]), ...centres.map((c) => alpha[c]).filter((i) => i >= 0)]),
  ];
  const table: SymbolTable = {
    layout: { ...layout },
    symbols,
    q,
    m,
    alpha,
    w,
    s,
    R,
    indexOf: (name) => byName.get(name),
    ladderOf: (i) => ladder.get(i),
    parameterIndices,
  };
  cache.set(key, table);
  return table;
}

/** A zero exponent vector for a table. */
export const zeroExponents = (t: SymbolTable): number[] => new Array<number>(t.symbols.length).fill(0);
