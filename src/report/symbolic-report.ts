/** Reports of the symbolic engine: derived closed forms and formula checks, as text, LaTeX and JSON. */
import { QUANTITY_MEANING, type DerivedQuantity, type SymbolicQuantity, type VariableSet } from '../engines/symbolic/derive.js';
import type { CheckResult } from '../engines/symbolic/formula-check.js';
import { symbolTable, type PairLayout, type SymbolRole, type SymbolTable } from '../engines/symbolic/symbols.js';
import { VERSION } from '../version.js';
import { sig, textTable } from './format.js';
import { LATEX_NAME } from './latex-names.js';


/** The symbols of a layout that a closed form in `variables` uses (for headers and JSON). */
function usedSymbols(table: SymbolTable, variables: VariableSet, withR: boolean) {
  const roles: SymbolRole[] = ['q', variables === 'mass' ? 'm' : 'alpha', 'w', ...(withR ? (['R'] as const) : [])];
  return roles.flatMap((role) => table.symbols.filter((s) => s.role === role));
}

function layoutSentence(layout: PairLayout, table: SymbolTable, variables: VariableSet): string {
  const names = (c: 'a' | 'b') =>
    usedSymbols(table, variables, false)
      .filter((s) => s.centre === undefined || s.centre === c)
      .map((s) => s.name)
      .join(', ');
  const freq = layout.anisotropic ? 'frequencies along the lab axes' : 'isotropic';
  return layout.identical
    ? `two identical quantum Drude oscillators (${names('a')}; ${freq}), A at the origin, B at +R on z`
    : `quantum Drude oscillators A (${names('a')}) at the origin and B (${names('b')}) at +R on z; ${freq}`;
}

/** The `derive` report as text (`name = formula` lines, pasteable) or LaTeX (one equation per line). */
export function derivedToText(layout: PairLayout, derived: readonly DerivedQuantity[], notation: 'text' | 'latex'): string {
  const table = symbolTable(layout);
  const variables = derived[0]?.variables ?? 'mass';
  const comment = notation === 'latex' ? '%' : '#';
  const lines = [`${comment} closed forms, atomic units: ${layoutSentence(layout, table, variables)}`];
  if (variables === 'alpha') lines.push(`${comment} alpha = q^2/(m w^2) is the static dipole polarisability`);
  const units = [...new Set(derived.map((d) => `${d.name} in ${QUANTITY_MEANING[d.name].units}`))].join(', ');
  lines.push(`${comment} ${units}; D7.a = lim R^7 mu_A,z, E(R) = -C6/R^6 - C8/R^8 - …`);
  for (const d of derived) lines.push(notation === 'latex' ? `${LATEX_NAME[d.name]} = ${d.display.latex}` : `${d.name} = ${d.display.text}`);
  return lines.join('\n') + '\n';
}

/** The `derive --json` object. */
export function derivedToJson(layout: PairLayout, derived: readonly DerivedQuantity[]): Record<string, unknown> {
  const table = symbolTable(layout);
  const variables = derived[0]?.variables ?? 'mass';
  const withR = derived.some((d) => d.name.startsWith('mu.'));
  return {
    units: 'atomic',
    layout: { species: layout.identical ? 'identical' : 'two', frequencies: layout.anisotropic ? 'anisotropic' : 'isotropic' },
    variables,
    symbols: usedSymbols(table, variables, withR).map((s) => ({ name: s.name, latex: s.latex, meaning: s.meaning })),
    quantities: derived.map((d) => ({
      name: d.name,
      meaning: QUANTITY_MEANING[d.name].meaning,
      units: QUANTITY_MEANING[d.name].units,
      text: d.display.text,
      latex: d.display.latex,
      shape: d.display.shape,
    })),
    dispole: { version: VERSION },
  };
}

function numericLine(r: CheckResult): string {
  const n = r.numeric;
  const how = n.exact ? 'exact rational arithmetic' : 'floating point';
  const what = n.measure === 'relative' ? 'largest relative deviation' : 'largest absolute deviation (the engine value is 0)';
  return `${what} ${sig(n.maxDeviation, 3)} over ${n.points} random points (${how}, seed ${n.seed})`;
}

/** The `check` report as text. */
export function checkToText(r: CheckResult): string {
  const lines = [`${r.quantity}: ${r.verdict === 'identical' ? 'identical' : 'DIFFERS'}`];
  const rows: Array<[string, string]> = [
    ['symbolic', r.symbolic.note],
    ['numeric', numericLine(r)],
  ];
  if (r.hint) rows.push(['hint', r.hint]);
  rows.push(['yours', r.expression.trim()]);
  rows.push(['engine', r.engineShown.display.text]);
  const width = Math.max(...rows.map(([k]) => k.length));
  for (const [k, v] of rows) lines.push(`  ${k.padEnd(width)}  ${v}`);
  if (r.verdict === 'differs' && r.samples.length > 0) {
    const names = Object.keys(r.samples[0].values);
    lines.push('');
    lines.push(
      textTable(
        [...names, 'yours', 'engine'],
        r.samples.map((s) => [...names.map((k) => sig(s.values[k], 6)), sig(s.yours, 10), sig(s.engine, 10)]),
      )
        .split('\n')
        .map((l) => `  ${l}`)
        .join('\n'),
    );
  }
  return lines.join('\n') + '\n';
}

/** The `check --json` object. */
export function checkToJson(r: CheckResult): Record<string, unknown> {
  return {
    quantity: r.quantity,
    layout: { species: r.layout.identical ? 'identical' : 'two', frequencies: r.layout.anisotropic ? 'anisotropic' : 'isotropic' },
    expression: r.expression,
    verdict: r.verdict,
    symbolic: r.symbolic,
    numeric: r.numeric,
    hint: r.hint,
    samples: r.samples,
    engine: { text: r.engineShown.display.text, latex: r.engineShown.display.latex, variables: r.engineShown.variables },
    dispole: { version: VERSION },
  };
}
