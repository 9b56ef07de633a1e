/**
 * What the numbers rest on, on the command line: the `accuracy` object of `pair --json` and table rows, MODEL
 * warnings in every format for stand-in QDOs of real atoms (with the model's B beside the published one), the
 * split between "routes agree" (numerical) and "model accuracy" (physical), and the recommended atoms.
 */
import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';
import { ATOM_LIBRARY } from '../../src/data/atom-library.js';
import { recommendedAtomBySymbol } from '../../src/engines/atoms/recommended-atoms.js';
import { expectClose } from '../helpers/tolerance.js';

async function run(argv: string[]) {
  const io = memoryIO();
  const code = await runCli(argv, io);
  return { code, out: io.out, err: io.err };
}

const HE_B_PUBLISHED = '-7.327'; // D. M. Bishop, J. Pipin, J. Chem. Phys. 91, 3549 (1989) (quoted from memory)
const HE_QDO_B = '-4.483'; // B = −2q³/(m²w⁴) of the QDO fitted to He's alpha, C6, C8 (Yan et al., PRA 54, 2824 (1996)); derived here

describe('stand-in QDOs of real atoms carry a MODEL warning everywhere', () => {
  test('pair He-qdo Ar-qdo: today\'s numbers, the routes agree (numerically), the model warning gives B = −4.483 beside the published −7.327', async () => {
    const { code, out } = await run(['pair', 'He-qdo', 'Ar-qdo']);
    expect(code).toBe(0);
    expect(out).toMatch(/^All routes agree \(numerical cross-check, largest relative spread [^)]*\): the arithmetic is checked, not the model\.$/m);
    expect(out).toMatch(/^Model accuracy \(physical; levels He-qdo: model, Ar-qdo: model\): /m);
    expect(out).toContain(`warning: MODEL: He-qdo is a quantum Drude oscillator standing in for helium`);
    expect(out).toContain(`the model's B = ${HE_QDO_B} (published static B of helium = ${HE_B_PUBLISHED}`);
    expect(out).toContain('warning: MODEL: Ar-qdo');
  });

  test('pair He-qdo Ar-qdo --json: accuracy.level per species, one-sentence statement, warnings; D7 as the fitted QDOs always gave', async () => {
    const { code, out } = await run(['pair', 'He-qdo', 'Ar-qdo', '--json']);
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(j.accuracy.level).toEqual({ a: 'model', b: 'model' });
    expect(j.accuracy.statement).toMatch(/^He-qdo: MODEL, a QDO standing in for helium \(model B = -4\.483 vs published -7\.327\); Ar-qdo: MODEL/);
    expect(j.accuracy.statement.trim().split(/\.\s/)).toHaveLength(1); // one sentence
    expect(j.accuracy.uncertainty).toBeUndefined();
    expect(j.warnings.filter((w: string) => w.startsWith('MODEL:'))).toHaveLength(2);
    // project history: `dispole pair He Ar` when He and Ar were these QDOs (10 significant digits)
    expectClose(j.coefficients.D7.a, -92.58562911, 1e-9);
    expectClose(j.coefficients.D7.b, 511.1158891, 1e-9);
    expect(j.trusted).toBe(true);
  });

  test('pair H H-qdo: the exact atom beside its QDO; only the QDO carries the warning, with B = −57.1 vs −106.5 (−213/2, Buckingham 1967)', async () => {
    const j = JSON.parse((await run(['pair', 'H', 'H-qdo', '--json'])).out);
    expect(j.accuracy.level).toEqual({ a: 'exact', b: 'model' });
    const model = j.warnings.filter((w: string) => w.startsWith('MODEL:'));
    expect(model).toHaveLength(1);
    expect(model[0]).toContain("B = -57.1 (published static B of hydrogen = -106.5");
  });

  test('exact pairs say so and carry no model warning: H–H and the invented Quelon', async () => {
    const j = JSON.parse((await run(['pair', 'H', 'Quelon', '--json'])).out);
    expect(j.accuracy.level).toEqual({ a: 'exact', b: 'exact' });
    expect(j.accuracy.statement).toContain('exact for the QDO as defined');
    expect(j.warnings.some((w: string) => w.startsWith('MODEL'))).toBe(false);
  });

  test('table: status "model" (never ok) for rows with a stand-in; JSON rows carry accuracy; the levels line marks the columns', async () => {
    const j = JSON.parse((await run(['table', 'He-qdo', 'H', '--json'])).out);
    const status = Object.fromEntries(j.rows.map((r: { a: string; b: string; status: string }) => [`${r.a}-${r.b}`, r.status]));
    expect(status).toEqual({ 'He-qdo-He-qdo': 'model', 'He-qdo-H': 'model', 'H-H': 'ok' });
    expect(j.rows[0].accuracy.level).toEqual({ a: 'model', b: 'model' });
    expect(j.levels).toMatch(/^C6, C8, C10: exact \(1 row\), model \(2 rows\); D7: exact \(1 row\), model \(2 rows\); species: He-qdo model, H exact/);
    const text = (await run(['table', 'He-qdo', 'H'])).out;
    expect(text).toMatch(/^He-qdo–H\s.*\smodel$/m);
    expect(text).toMatch(/^levels: C6, C8, C10: exact \(1 row\), model \(2 rows\)/m);
    expect(text).toContain(`warning: MODEL: He-qdo is a quantum Drude oscillator`);
    const md = (await run(['table', 'He-qdo', 'H', '--markdown'])).out;
    expect(md).toMatch(/^- levels: C6, C8, C10: exact/m);
    expect(md).toMatch(/\| model \|$/m);
  });

  test('table --latex: the section-sign mark on model rows, its note under the table, the levels, the warning with both B values', async () => {
    const { code, out } = await run(['table', 'He-qdo', 'H', '--latex']);
    expect(code).toBe(0);
    expect(out).toMatch(/He-qdo--H\$\^\{\\S\}\$ &/);
    expect(out).toMatch(/^ {2}\$\^\{\\S\}\$\\,/m);
    expect(out).toMatch(/^ {2}Levels: C6, C8, C10: exact \(1 row\), model \(2 rows\)/m);
    expect(out).toContain(`% warning: MODEL: He-qdo`);
    expect(out).toContain(`B = ${HE_QDO_B} (published static B of helium = ${HE_B_PUBLISHED}`);
  });
});

describe('recommended atoms', () => {
  test('pair He Ar --json: accuracy object with a level per species; rescaled with a D7 uncertainty where first-principles data are shipped, else the QDO with the model warning', async () => {
    const { code, out } = await run(['pair', 'He', 'Ar', '--json']);
    expect(code).toBe(0);
    const j = JSON.parse(out);
    for (const [k, sym] of [['a', 'He'], ['b', 'Ar']] as const) {
      const rec = recommendedAtomBySymbol(sym);
      expect(j.accuracy.level[k]).toBe(rec ? 'rescaled' : 'model');
      if (!rec) expect(j.warnings.some((w: string) => w.startsWith(`MODEL: ${sym} is a quantum Drude oscillator`))).toBe(true);
    }
    if (recommendedAtomBySymbol('He') || recommendedAtomBySymbol('Ar')) {
      const u = j.accuracy.uncertainty;
      for (const k of ['a', 'b', 'total']) expect(u.D7[k]).toBeGreaterThan(0);
      expect(u.models.map((m: { model: string }) => m.model)).toEqual(['first-principles (unscaled)', 'fitted QDO']);
      expect(j.routes[0].name).toBe('response');
    }
  });

  test('pair He Ar (text): each species line is one short line that names the level and the fitted data and points to the full sources; `species` lists them in full', async () => {
    const { out } = await run(['pair', 'He', 'Ar']);
    const line = out.split('\n').find((l) => l.startsWith('  A  He:'))!;
    expect(line.length).toBeLessThan(400);
    expect(line).toMatch(/\[recommended helium: .*response rescaled to published alpha, C6, C8, C10, B \(full sources: dispole species\)\]/);
    expect(line).toMatch(/tail alpha→[\d.]+\/u²/); // the fitted tail coefficient, not an electron count
    expect(line).not.toMatch(/Yan|Bishop/);
    const listing = (await run(['species'])).out;
    expect(listing).toMatch(/Bishop/);
  });
  test('each recommended atom reproduces its published alpha and C6 (and B where published) exactly (sources in atom-library.ts)', async () => {
    for (const a of ATOM_LIBRARY) {
      const rec = recommendedAtomBySymbol(a.symbol);
      if (!rec) continue;
      expect(rec.species.alpha[0]).toBeCloseTo(a.alpha.value, 12);
      if (a.B) expectClose(rec.species.hyperB![0], a.B.value, 1e-14);
      const j = JSON.parse((await run(['pair', a.symbol, a.symbol, '--json'])).out);
      expectClose(j.coefficients.C6, a.C6.value, 1e-12, 0, `${a.symbol} C6`);
      expectClose(j.coefficients.C8, a.C8.value, 1e-12, 0, `${a.symbol} C8`);
      expect(j.accuracy.level).toEqual({ a: 'rescaled', b: 'rescaled' });
    }
  });

  test('table He Ne Ar Kr Xe --json: every row says per species whether it is rescaled (data shipped) or a model; the levels line marks the columns', async () => {
    const { code, out } = await run(['table', 'He', 'Ne', 'Ar', 'Kr', 'Xe', '--json']);
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(j.rows).toHaveLength(15);
    const level = (sym: string) => (recommendedAtomBySymbol(sym) ? 'rescaled' : 'model');
    for (const row of j.rows) {
      expect(row.accuracy.level).toEqual({ a: level(row.a), b: level(row.b) });
      expect(row.status).toBe(level(row.a) === 'model' || level(row.b) === 'model' ? 'model' : 'unchecked');
    }
    expect(j.levels).toMatch(/^C6, C8, C10: [a-z -]+( \(\d+ rows?\))?(, [a-z -]+ \(\d+ rows?\))*; D7: /);
    expect(j.levels).toContain(`species: He ${level('He')}, Ne ${level('Ne')}, Ar ${level('Ar')}, Kr ${level('Kr')}, Xe ${level('Xe')}`);
  });

  test('species: a level per built-in, the recommended atoms with what each value rests on, JSON with accuracy', async () => {
    const { code, out } = await run(['species']);
    expect(code).toBe(0);
    expect(out).toMatch(/^H\s+hydrogenic Z=1 .*\sexact$/m);
    expect(out).toMatch(/^He-qdo\s+drude .*\smodel$/m);
    expect(out).toMatch(/^Quelon\s+drude .*\sexact$/m);
    expect(out).toContain('Recommended atoms (the names He … Xe; the fitted QDOs stay available as He-qdo … Xe-qdo):');
    for (const a of ATOM_LIBRARY) expect(out).toMatch(new RegExp(`^${a.symbol}\\s+(rescaled|model)\\s`, 'm'));
    expect(out).toContain('Rule: alpha_l(iu) = s_l·alpha_l^TDHF(iu/λ)');
    const list = JSON.parse((await run(['species', '--json'])).out);
    expect(list.find((s: { name: string }) => s.name === 'He-qdo').accuracy.level).toBe('model');
    expect(list.find((s: { name: string }) => s.name === 'H').accuracy.level).toBe('exact');
  });
});
