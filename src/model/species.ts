/**
 * Species: every kind of centre dispole can put in a pair. Plain data, discriminated by `kind`.
 * To add a kind: add its data type to {@link Species}, a builder in `species-kinds.ts`, and its
 * computational capabilities in `src/engines/capabilities.ts` (see DEVELOPERS.md).
 */
import type { DrudeSpecies } from './drude.js';

export type { DrudeSpecies } from './drude.js';

/** Any species. */
export type Species = DrudeSpecies;

/** A one-line, human description of a species' parameters (atomic units). */
export function describeSpecies(s: Species): string {
  switch (s.kind) {
    case 'drude': {
      const [wx, wy, wz] = s.w;
      const freq = wx === wy && wy === wz ? `w=${fmt(wx)}` : `wx=${fmt(wx)},wy=${fmt(wy)},wz=${fmt(wz)}`;
      return `drude q=${fmt(s.q)} m=${fmt(s.m)} ${freq}`;
    }
  }
}

function fmt(x: number): string {
  return Number(x.toPrecision(10)).toString();
}
