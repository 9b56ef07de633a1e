import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { allPairs, computeTable } from '../../src/engines/table.js';
import { demoSpecies, resolveSpecies } from '../../src/model/builtin-species.js';
import { drude } from '../../src/model/drude.js';
import { csvField, latexEscape, latexNumber, markdownEscape, renderTable, TABLE_FORMATS } from '../../src/report/table/index.js';
import { VERSION } from '../../src/version.js';
import { computeSurfaceTable } from '../../src/engines/surface/surface-table.js';
import { deriveSurfaceQuantities } from '../../src/engines/symbolic/symbolic-surface.js';
import { hydrogenic } from '../../src/model/hydrogenic.js';
import { LATEX_NAME } from '../../src/report/latex-names.js';
import { surfaceDerivedToText } from '../../src/report/surface-report.js';
import { renderSurfaceTable } from '../../src/report/table/surface-columns.js';
import { expectClose } from '../helpers/tolerance.js';

const OPTIONS = { routes: ['perturbation', 'response'], agreement: 1e-8, relTol: 1e-13 };
const [Quelon, Virid, Sorrel] = demoSpecies;
/** A species whose name and source carry characters every format must escape (invented test data). */
const awkward = drude({ q: 1.3, m: 0.5, w: 0.7 }, 'Odd_&|"x,y"%', 'invented: 50% "made up", α ≈ 2.6 a0³ #1');
const table = computeTable(allPairs([Quelon, Virid, awkward]), OPTIONS);
const untrusted = computeTable(allPairs([Quelon, Sorrel]), { ...OPTIONS, agreement: 1e-300 });

/** Minimal RFC 4180 reader (quoted fields, doubled quotes) for checking our CSV; skips "#" lines. */
function readCsv(text: string): string[][] {
  const rows: string[][] = [];
  for (const line of text.split('\n').filter((l) => l !== '' && !l.startsWith('#'))) {
    const cells: string[] = [];
    let i = 0;
    while (i <= line.length) {
      if (line[i] === '"') {
        let v = '';
        i++;
        while (i < line.length) {
          if (line[i] === '"' && line[i + 1] === '"') (v += '"'), (i += 2);
          else if (line[i] === '"') break;
          else v += line[i++];
        }
        cells.push(v);
        i += 2; // closing quote and comma
      } else {
        const end = line.indexOf(',', i) < 0 ? line.length : line.indexOf(',', i);
        cells.push(line.slice(i, end));
        i = end + 1;
      }
    }
    rows.push(cells);
  }
  return rows;
}

/**
 * Structural check of a LaTeX table (common practice for booktabs tables): environments nested and closed,
 * braces and $ balanced, booktabs rules once each in order and no \hline, every tabular row with as many cells
 * as the column specification. Returns the problems found (empty when sound).
 */
function latexProblems(tex: string): string[] {
  const problems: string[] = [];
  const body = tex.split('\n').filter((l) => !l.startsWith('%'));
  const code = body.join('\n').replace(/\\[\\{}$&%#_]/g, '');
  const stack: string[] = [];
  for (const m of code.matchAll(/\\(begin|end)\{([^}]*)\}/g)) {
    if (m[1] === 'begin') stack.push(m[2]);
    else {
      const open = stack.pop();
      if (open !== m[2]) problems.push(`\\end{${m[2]}} while ${open ?? 'nothing'} is open`);
    }
  }
  if (stack.length) problems.push(`unclosed environments: ${stack.join(', ')}`);
  let depth = 0;
  for (const c of code) {
    depth += c === '{' ? 1 : c === '}' ? -1 : 0;
    if (depth < 0) problems.push('a } closes nothing');
  }
  if (depth !== 0) problems.push('braces unbalanced');
  for (const l of body) if ((l.replace(/\\\$/g, '').match(/\$/g) ?? []).length % 2) problems.push(`odd number of $ in: ${l}`);
  const rules = ['\\toprule', '\\midrule', '\\bottomrule'].map((r) => body.findIndex((l) => l.trim() === r));
  if (rules.some((i) => i < 0) || !(rules[0] < rules[1] && rules[1] < rules[2])) problems.push('booktabs rules missing or out of order');
  for (const r of ['\\toprule', '\\midrule', '\\bottomrule']) if (body.filter((l) => l.trim() === r).length !== 1) problems.push(`${r} not exactly once`);
  if (tex.includes('\\hline')) problems.push('\\hline used');
  const spec = /\\begin\{tabular\}\{([^}]*)\}/.exec(tex)?.[1] ?? '';
  const ncol = spec.replace(/[^lcr]/g, '').length;
  const rows = body.slice(rules[0] + 1, rules[2]).filter((l) => l.trim() !== '\\midrule');
  for (const l of rows) {
    if (!l.trimEnd().endsWith('\\\\')) problems.push(`row does not end with \\\\: ${l}`);
    const cells = l.replace(/\\&/g, '').split('&').length;
    if (cells !== ncol) problems.push(`${cells} cells for ${ncol} columns: ${l}`);
  }
  return problems;
}

describe('renderTable: deterministic in every format', () => {
  test.each(TABLE_FORMATS)('%s: the same table gives the same bytes, a recomputed table too, and no date', (format) => {
    const again = computeTable(allPairs([Quelon, Virid, awkward]), OPTIONS);
    const a = renderTable(table, format, { units: 'atomic', digits: 6 });
    expect(renderTable(again, format, { units: 'atomic', digits: 6 })).toBe(a);
    expect(a).toContain(VERSION);
    expect(a).not.toMatch(/20\d\d-\d\d-\d\d/);
    expect(a.endsWith('\n')).toBe(true);
  });
});

describe('untrusted rows are flagged in every format', () => {
  test.each(TABLE_FORMATS)('%s says UNTRUSTED', (format) => {
    const out = renderTable(untrusted, format, { units: 'atomic', digits: 6 });
    expect(out).toContain('UNTRUSTED');
    expect(renderTable(table, format, { units: 'atomic', digits: 6 })).not.toMatch(/\bUNTRUSTED:|"status": "UNTRUSTED"|,UNTRUSTED,/);
  });
  test('text: status column and a summary line', () => {
    const out = renderTable(untrusted, 'text', { units: 'atomic', digits: 6 });
    expect(out).toMatch(/^Quelon–Sorrel .* UNTRUSTED$/m);
    expect(out).toContain('UNTRUSTED: 3 of 3 rows');
    expect(out).toMatch(/warning: routes disagree: largest relative spread .* > 1e-300 — Quelon–Quelon/);
  });
  test('LaTeX: a dagger on each untrusted pair, explained under the table', () => {
    const out = renderTable(untrusted, 'latex', { units: 'atomic', digits: 6 });
    expect(out.match(/--Sorrel\$\^\{\\dagger\}\$ &/g)).toHaveLength(2);
    expect(out).toContain('$^{\\dagger}$\\,UNTRUSTED: a route did not converge or the routes disagree');
  });
  test('CSV and JSON: a status per row', () => {
    const csv = readCsv(renderTable(untrusted, 'csv', { units: 'atomic', digits: 6 }));
    const status = csv[0].indexOf('status');
    expect(csv.slice(1).map((r) => r[status])).toEqual(['UNTRUSTED', 'UNTRUSTED', 'UNTRUSTED']);
    const j = JSON.parse(renderTable(untrusted, 'json', { units: 'atomic', digits: 6 }));
    expect(j.untrustedRows).toBe(3);
    expect(j.rows.map((r: { trusted: boolean }) => r.trusted)).toEqual([false, false, false]);
  });
});

describe('JSON document', () => {
  const j = JSON.parse(renderTable(table, 'json', { units: 'atomic', digits: 6 }));
  test('keeps the contract {"units":"atomic","rows":[{a,b,C6,C8,D7:{a,b,total},spread}]} with the exact numbers', () => {
    expect(j.units).toBe('atomic');
    expect(j.rows).toHaveLength(6);
    j.rows.forEach((row: Record<string, unknown>, i: number) => {
      const r = table.rows[i].result;
      expect(row).toMatchObject({ a: r.a.name, b: r.b.name, C6: r.coefficients.C6, C8: r.coefficients.C8, D7: r.coefficients.D7, spread: r.spread.max });
      expect(typeof row.spread).toBe('number');
    });
  });
  test('records the provenance: version, routes, tolerances, species definitions with sources', () => {
    expect(j.dispole).toEqual({ version: VERSION });
    expect(j.routes).toEqual({ requested: ['perturbation', 'response'], run: ['perturbation', 'response'] });
    expect(j.tolerances).toEqual({ agreement: 1e-8, relTol: 1e-13, maxQuanta: null });
    expect(j.species.map((s: { name: string }) => s.name)).toEqual(['Quelon', 'Virid', awkward.name]);
    expect(j.species[2]).toMatchObject({ kind: 'drude', q: 1.3, m: 0.5, w: [0.7, 0.7, 0.7], source: awkward.source });
    expect(j.rows[5].sources).toEqual({ a: awkward.source, b: awkward.source });
  });
  test('--units si adds an si block per row (CODATA 2018: Eh = 4.3597447222071e-18 J, a0 = 0.529177210903e-10 m, e = 1.602176634e-19 C; Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021))', () => {
    const s = JSON.parse(renderTable(table, 'json', { units: 'si', digits: 6 }));
    expect(s.units).toBe('atomic');
    const r = s.rows[1];
    const a0 = 0.529177210903e-10;
    expectClose(r.si.C6, r.C6 * 4.3597447222071e-18 * a0 ** 6, 1e-12);
    expectClose(r.si.C8, r.C8 * 4.3597447222071e-18 * a0 ** 8, 1e-12);
    expectClose(r.si.D7.a.Cm8, r.D7.a * 1.602176634e-19 * a0 ** 8, 1e-12);
    // debye = 1e-21/c C·m (common practice), so e·a0 = 2.541746473 D (CODATA 2018, rounded here to 10 digits)
    expectClose(r.si.D7.b.debyeAngstrom7, r.D7.b * 2.541746473 * 0.529177210903 ** 7, 1e-9);
  });
});

describe('CSV', () => {
  const rows = readCsv(renderTable(table, 'csv', { units: 'atomic', digits: 6 }));
  test('one header and one line per pair, awkward names and sources quoted so they read back intact', () => {
    expect(rows[0].slice(0, 9)).toEqual(['a', 'b', 'C6 (Eh a0^6)', 'C8 (Eh a0^8)', 'C10 (Eh a0^10)', 'D7.a (e a0^8)', 'D7.b (e a0^8)', 'D7.total (e a0^8)', 'spread']);
    expect(rows).toHaveLength(7);
    for (const r of rows) expect(r).toHaveLength(rows[0].length);
    expect(rows[6].slice(0, 2)).toEqual([awkward.name, awkward.name]);
    expect(rows[6][rows[0].indexOf('source a')]).toBe(awkward.source);
  });
  test('numbers are full precision (they read back to the same doubles)', () => {
    table.rows.forEach(({ result: r }, i) => {
      expect(Number(rows[i + 1][2])).toBe(r.coefficients.C6);
      expect(Number(rows[i + 1][5])).toBe(r.coefficients.D7.a);
    });
  });
  test('provenance lines start with "#"', () => {
    const text = renderTable(table, 'csv', { units: 'atomic', digits: 6 });
    expect(text.split('\n')[0]).toBe(`# dispole ${VERSION}: dispersion coefficients and dispersion-induced dipoles of 6 pairs`);
    expect(text).toContain('# routes: perturbation (reference), response\n');
    expect(text).toContain('# tolerances: agreement 1e-8; route relTol 1e-13; perturbation basis exact minimum\n');
  });
  test('csvField quotes commas, quotes and line breaks (RFC 4180)', () => {
    expect([csvField('plain'), csvField('a,b'), csvField('say "x"'), csvField('l1\nl2')]).toEqual(['plain', '"a,b"', '"say ""x"""', '"l1\nl2"']);
  });
});

describe('text and Markdown', () => {
  test('text: units in the header and --digits significant digits', () => {
    const out = renderTable(table, 'text', { units: 'atomic', digits: 4 });
    expect(out).toMatch(/^pair\s+C6 \(Eh a0\^6\)\s+C8 \(Eh a0\^8\)\s+D7\.a \(e a0\^8\)\s+D7\.b \(e a0\^8\)\s+D7\.total \(e a0\^8\)\s+spread\s+sources\s+status$/m);
    // Quelon–Virid C6 = 33.86632062 (London formula with the built-in parameters; see tests/cli/pair.test.ts)
    expect(out).toMatch(/^Quelon–Virid\s+33\.87\s/m);
    expect(out).toContain('units: atomic (C_n in Eh·a0^n, D7 in e·a0^8)');
    expect(out).toContain(`  ${awkward.name}: drude q=1.3 m=0.5 w=0.7 [2]`);
  });
  test('text in SI: C6 in J m^6, D7 in C m^8 and in D Å^7, said in the header', () => {
    const out = renderTable(table, 'text', { units: 'si', digits: 6 });
    expect(out).toContain('units: SI, CODATA 2018 (C_n in J·m^n, D7 in C·m^8 and in debye·Å^7)');
    expect(out).toMatch(/C6 \(J m\^6\)\s+C8 \(J m\^8\)\s+D7\.a \(C m\^8\)\s+D7\.b \(C m\^8\)\s+D7\.total \(C m\^8\)\s+D7\.a \(D Å\^7\)/);
  });
  test('Markdown: every table line has the same number of cells, special characters escaped', () => {
    const out = renderTable(table, 'markdown', { units: 'atomic', digits: 6 });
    const lines = out.split('\n').filter((l) => l.startsWith('| '));
    expect(lines).toHaveLength(8);
    const cells = (l: string) => l.replace(/\\\|/g, '').split('|').length;
    for (const l of lines) expect(cells(l)).toBe(cells(lines[0]));
    expect(lines[1]).toBe('| --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | --- |');
    expect(out).toContain(markdownEscape(awkward.name));
    expect(markdownEscape('a|b_c*[1]')).toBe('a\\|b\\_c\\*\\[1\\]');
  });
});

describe('LaTeX (booktabs)', () => {
  test.each(['atomic', 'si'] as const)('%s units: passes the structural check, units in the header', (units) => {
    const tex = renderTable(table, 'latex', { units, digits: 5 });
    expect(latexProblems(tex)).toEqual([]);
    expect(tex).toContain(units === 'atomic' ? '($E_\\mathrm{h}\\,a_0^{6}$)' : '($\\mathrm{J\\,m^{6}}$)');
    expect(tex).toContain(units === 'atomic' ? 'in atomic units' : 'in SI units (CODATA 2018)');
    if (units === 'atomic') expect(tex).toContain('    Quelon--Virid & $33.866$ & $580.19$ & ');
  });
  test('the structural check finds broken tables', () => {
    const tex = renderTable(table, 'latex', { units: 'atomic', digits: 5 });
    // the default LaTeX columns: pair, C6, C8, D7.a, D7.b, spread, sources (the status is a mark after the pair)
    expect(latexProblems(tex.replace(' & $', ' $'))[0]).toMatch(/cells for 7 columns/);
    expect(latexProblems(tex.replace('\\end{tabular}', ''))).toEqual(['\\end{table} while tabular is open', 'unclosed environments: table']);
    expect(latexProblems(tex.replace('\\midrule', '\\hline'))).toEqual(expect.arrayContaining(['\\hline used']));
  });
  test('escapes special characters; numbers in math mode with ×10^n', () => {
    expect(latexEscape('a_b & 50% #1 {x} ~^\\ [1] α–β')).toBe(
      'a\\_b \\& 50\\% \\#1 \\{x\\} \\textasciitilde{}\\textasciicircum{}\\textbackslash{} {[}1{]} \\ensuremath{\\alpha}--\\ensuremath{\\beta}',
    );
    expect([latexNumber('-1.25e-7'), latexNumber('3.5'), latexNumber('1e21'), latexNumber('—'), latexNumber('0')]).toEqual([
      '$-1.25\\times10^{-7}$', '$3.5$', '$1\\times10^{21}$', '---', '$0$',
    ]);
    const tex = renderTable(table, 'latex', { units: 'atomic', digits: 5 });
    expect(tex).toContain('Odd\\_\\&\\textbar{}"x,y"\\%');
  });
  test('line breaks in names and sources (possible in YAML) never break the layout', () => {
    const multi = drude({ q: 1, m: 0.4, w: 0.8 }, 'Two\nLines', 'first line\nsecond line');
    const t = computeTable([[multi, Quelon]], OPTIONS);
    const out = renderTable(t, 'latex', { units: 'atomic', digits: 5 });
    expect(latexProblems(out)).toEqual([]);
    const head = out.split('\\begin{table}')[0].trimEnd().split('\n');
    for (const l of head) expect(l.startsWith('%')).toBe(true);
    expect(out).toContain('% sources:\n%   [1] first line second line\n');
    expect(renderTable(t, 'text', { units: 'atomic', digits: 5 })).toMatch(/^Two Lines–Quelon /m);
  });
  test('surface column set (table --surface --latex): passes the structural check; hydrogen C3 = 1/4, D4 = 99/16; one notation with derive --surface', () => {
    const hydrogen = hydrogenic({ Z: 1 }, 'H');
    const t = computeSurfaceTable([hydrogen, Quelon, awkward], { kind: 'conductor' });
    const tex = renderSurfaceTable(t, 'latex', { units: 'atomic', digits: 7 });
    expect(latexProblems(tex)).toEqual([]);
    // species, C3, C5, D4, spread, source: a row with a missing cell is found
    expect(latexProblems(tex.replace(' & $', ' $'))[0]).toMatch(/cells for 6 columns/);
    // hydrogen 1s in front of a perfect conductor: C3 = <r²>/12 = 1/4 (image-dipole result of J. E. Lennard-Jones,
    // Trans. Faraday Soc. 28, 333 (1932), volume and page quoted from memory) and D4 = 99/16 = 6.1875 (derived here,
    // in tests/engines/surface.test.ts); formatted to 7 significant digits
    expect(tex).toMatch(/^ {4}H & \$0\.2500000\$ & \$1\.125000\$ & \$6\.187500\$ & /m);
    expect(tex).toContain('Odd\\_\\&\\textbar{}"x,y"\\%');
    // the notation of derive --surface --latex (src/report/latex-names.ts)
    for (const name of ['C3', 'C5', 'D4'] as const) expect(tex).toContain(`& $${LATEX_NAME[name]}$ &`);
    const derived = surfaceDerivedToText(deriveSurfaceQuantities(['C3', 'C5', 'D4'], false), false, 'latex');
    for (const name of ['C3', 'C5', 'D4'] as const) expect(derived).toMatch(new RegExp(`^${LATEX_NAME[name].replace(/[\\{}^]/g, '\\$&')} = `, 'm'));
    expect(tex).toContain('($E_\\mathrm{h}\\,a_0^{3}$)');
    const si = renderSurfaceTable(t, 'latex', { units: 'si', digits: 5 });
    expect(latexProblems(si)).toEqual([]);
    expect(si).toContain('in SI units (CODATA 2018)');
    expect(si).toContain('($\\mathrm{D}\\,\\mathring{\\mathrm{A}}^{4}$)');
  });
  test('surface column set: a single-route row carries the double dagger and its note', () => {
    const t = computeSurfaceTable([Quelon], { kind: 'conductor' }, { routes: ['response'] });
    const tex = renderSurfaceTable(t, 'latex', { units: 'atomic', digits: 5 });
    expect(latexProblems(tex)).toEqual([]);
    expect(tex).toMatch(/^ {4}Quelon\$\^\{\\ddagger\}\$ & /m);
    expect(tex).toContain('Only one route could run: no cross-check.');
  });
  const tex = ['pdflatex', 'lualatex', 'xelatex'].find((e) => spawnSync('which', [e]).status === 0);
  if (tex) {
    test(`compiles with ${tex}`, () => {
      const dir = mkdtempSync(join(tmpdir(), 'dispole-tex-'));
      writeFileSync(join(dir, 'table.tex'), renderTable(table, 'latex', { units: 'si', digits: 5 }));
      writeFileSync(join(dir, 'doc.tex'), '\\documentclass{article}\n\\usepackage{booktabs}\n\\begin{document}\n\\input{table.tex}\n\\end{document}\n');
      execFileSync(tex, ['-interaction=nonstopmode', '-halt-on-error', 'doc.tex'], { cwd: dir, stdio: 'pipe', timeout: 60_000 });
    });
  } else {
    test.skip('compiles with a TeX engine — skipped: no pdflatex, lualatex or xelatex on PATH', () => {});
  }
});

describe('provenance: the route that served as reference', () => {
  test('recommended atoms run only the response route: the header names it as the reference, not the unrun perturbation route', () => {
    const t = computeTable(allPairs([resolveSpecies('He'), resolveSpecies('Ne')]), { routes: ['perturbation', 'response'] });
    const text = renderTable(t, 'text', { units: 'atomic', digits: 6 });
    expect(text).toContain('routes: perturbation, response; ran: response; reference: response (the first listed route that ran for each pair; perturbation ran for no pair)\n');
    expect(text).not.toContain('perturbation (reference)');
  });
  test('a mixed table names both references; a table where the first route always ran keeps the plain form', () => {
    const mixed = computeTable(allPairs([Quelon, resolveSpecies('He')]), { routes: ['perturbation', 'response'] });
    expect(renderTable(mixed, 'text', { units: 'atomic', digits: 6 })).toContain('routes: perturbation (reference), response; reference: perturbation or response (the first listed route that ran for each pair)\n');
    expect(renderTable(table, 'text', { units: 'atomic', digits: 6 })).toContain('routes: perturbation (reference), response\n');
  });
});
