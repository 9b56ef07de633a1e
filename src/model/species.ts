/**
 * Species: every kind of centre dispole can put in a pair. Plain data, discriminated by `kind`.
 * To add a kind: add its data type to {@link Species}, a builder in `species-kinds.ts`, and its
 * computational capabilities in `src/engines/capabilities.ts` (see DEVELOPERS.md).
 */
import type { DrudeSpecies } from './drude.js';
import type { HydrogenicSpecies } from './hydrogenic.js';
import { describeTdhf, type TdhfSpecies } from './closed-shell.js';
import type { OscillatorSpectrumSpecies, ResponseTableSpecies } from './response-data.js';
import { sig } from './number-text.js';

export type { DrudeSpecies } from './drude.js';
export type { HydrogenicSpecies } from './hydrogenic.js';
export type { TdhfSpecies } from './closed-shell.js';
export type { OscillatorSpectrumSpecies, ResponseTableSpecies } from './response-data.js';

/** Any species. */
export type Species = DrudeSpecies | HydrogenicSpecies | ResponseTableSpecies | OscillatorSpectrumSpecies | TdhfSpecies;

/** A one-line, human description of a species' parameters (atomic units). */
export function describeSpecies(s: Species): string {
  switch (s.kind) {
    case 'drude': {
      const [wx, wy, wz] = s.w;
      const freq = wx === wy && wy === wz ? `w=${fmt(wx)}` : `wx=${fmt(wx)},wy=${fmt(wy)},wz=${fmt(wz)}`;
      return `drude q=${fmt(s.q)} m=${fmt(s.m)} ${freq}`;
    }
    case 'tdhf':
      return describeTdhf(s);
    case 'hydrogenic':
      return `hydrogenic Z=${fmt(s.Z)} basis=${s.basis} (Sturmian pseudo-spectrum, l ≤ 3)`;
    case 'response-table': {
      const last = s.u.length - 1;
      const b = s.hyperB ? 'B(0;iu,-iu) tabulated' : `static B=${fmt(s.staticB ?? 0)} (D7 approximate)`;
      const extra = s.alpha3 ? ', alpha2, alpha3' : s.alpha2 ? ', alpha2' : '';
      const n = s.electrons !== undefined ? `, tail alpha→${fmt(s.electrons)}/u²` : '';
      return `response table: ${s.u.length} points u=0…${fmt(s.u[last])} Eh, alpha(0)=${fmt(s.alpha[0])}${extra}, ${b}${n}`;
    }
    case 'oscillator-spectrum': {
      let a0 = 0;
      s.energies.forEach((w, i) => (a0 += s.strengths[i] / (w * w)));
      const n = s.electrons !== undefined ? `, N=${fmt(s.electrons)}` : '';
      return `pseudo-spectrum: ${s.energies.length} lines, alpha(0)=${fmt(a0)}, static B=${fmt(s.staticB)} (D7 approximate)${n}`;
    }
  }
}

const fmt = (x: number): string => sig(x, 10);

/** The source as one-line reports show it: the short form where a species has one (the full one is in `species`). */
export function sourceInBrief(s: Species): string | undefined {
  return (s.kind === 'response-table' ? s.sourceBrief : undefined) ?? s.source;
}
