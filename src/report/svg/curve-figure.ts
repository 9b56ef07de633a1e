/**
 * The figure of `dispole curve --svg`: (a) log–log |mu_z| of each centre and of the pair against R with the
 * asymptotic forms |D7|/R^7 dashed, (b) log–log −ΔE against R with −C6/R^6 − C8/R^8 dashed and the leading
 * C6/R^6 dotted. Exact values are solid lines with markers; untrusted points are open markers.
 */
import { asymptoticForms, toUnit, unitName, type CurveData } from '../curve-report.js';
import { chartPanel, legendRow, type Series } from './chart-panel.js';
import { SERIES_COLOURS } from './colours.js';
import { svgDocument, text } from './svg-markup.js';

/** Points of a smooth asymptotic curve across the plotted R range (R in bohr for the formula). */
function smooth(d: CurveData, f: (R: number) => number): Array<[number, number]> {
  const R0 = d.rows[0].R, R1 = d.rows[d.rows.length - 1].R;
  return Array.from({ length: 160 }, (_, k) => {
    const R = R0 * (R1 / R0) ** (k / 159);
    return [toUnit(R, d.lengthUnit), f(R)] as [number, number];
  });
}

/** The whole SVG document. */
export function curveFigure(d: CurveData): string {
  const W = 1000, H = 870;
  const u = unitName(d.lengthUnit);
  const xLabel = `R (${u})`;
  const c = d.coefficients;
  const hollow = d.rows.map((r) => !r.trusted);
  const x = d.rows.map((r) => toUnit(r.R, d.lengthUnit));
  const scale = Math.max(...d.rows.map((r) => Math.max(Math.abs(r.muA), Math.abs(r.muB))));
  const showTotal = d.rows.some((r) => Math.abs(r.muTotal) > 1e-9 * scale);
  const dipoleLaw = `${c.D4 ? 'D_{4}/R^{4} + ' : ''}D_{7}/R^{7}`;
  const energyLaw = c.C8 !== undefined ? `${c.E5 ? '−E_{5}/R^{5} + ' : ''}C_{6}/R^{6} + C_{8}/R^{8}` : 'C_{6}/R^{6}';

  const centres = [
    { key: 'muA' as const, name: d.a.name, sym: 'μ_{A,z}', colour: SERIES_COLOURS[0], d7: c.D7.a },
    { key: 'muB' as const, name: d.b.name, sym: 'μ_{B,z}', colour: SERIES_COLOURS[1], d7: c.D7.b },
    ...(showTotal ? [{ key: 'muTotal' as const, name: 'pair', sym: 'μ_{A,z}+μ_{B,z}', colour: SERIES_COLOURS[2], d7: c.D7.total }] : []),
  ];
  const dipoleSeries: Series[] = [
    ...centres.map((s) => ({
      label: '',
      points: d.rows.map((r, i) => [x[i], Math.abs(r[s.key])] as [number, number]),
      colour: s.colour,
      markers: true,
      hollow,
    })),
    ...centres.map((s) => ({
      label: '',
      points: smooth(d, (R) => Math.abs(asymptoticForms(c, R)[s.key])),
      colour: s.colour,
      dash: '7 4',
      width: 1.2,
    })),
  ];
  const ratioSeries: Series[] = [
    { label: '', points: [[x[0], 1], [x[x.length - 1], 1]], colour: '#999999', width: 0.8 },
    ...centres.map((s) => ({
      label: '',
      points: d.rows.map((r, i) => [x[i], r[s.key] / r.asymptotic[s.key]] as [number, number]),
      colour: s.colour,
      markers: true,
      hollow,
    })),
  ];
  const energySeries: Series[] = [
    { label: 'exact, −ΔE', points: d.rows.map((r, i) => [x[i], -r.energy] as [number, number]), colour: SERIES_COLOURS[0], markers: true, hollow },
    { label: energyLaw, points: smooth(d, (R) => -asymptoticForms(c, R).energy), colour: SERIES_COLOURS[1], dash: '7 4', width: 1.4 },
    { label: 'C_{6}/R^{6}', points: smooth(d, (R) => c.C6 / R ** 6), colour: '#777777', dash: '2 3', width: 1.2 },
  ];
  const energyRatio: Series[] = [
    { label: '', points: [[x[0], 1], [x[x.length - 1], 1]], colour: '#999999', width: 0.8 },
    { label: `÷ (${energyLaw})`, points: d.rows.map((r, i) => [x[i], r.energy / r.asymptotic.energy] as [number, number]), colour: SERIES_COLOURS[1], markers: true, hollow },
    { label: '÷ C_{6}/R^{6}', points: d.rows.map((r, i) => [x[i], -r.energy / (c.C6 / r.R ** 6)] as [number, number]), colour: '#777777', markers: true, hollow },
  ];

  const key = [
    ...centres.map((s) => ({ label: `${s.sym} (${s.name}, ${s.d7 < 0 ? '< 0' : '> 0'})`, colour: s.colour, markers: true })),
    { label: `asymptotic ${dipoleLaw}`, colour: '#555555', dash: '7 4', width: 1.2 },
    ...(d.rows.some((r) => !r.trusted) ? [{ label: 'untrusted point', colour: '#555555', markers: true, open: true, width: 0 }] : []),
  ];
  const top = { y: 88, height: 320 }, bottom = { y: 516, height: 240 };
  const left = { x: 100, width: 360 }, right = { x: 605, width: 360 };
  const body = [
    text(W / 2, 28, `${d.a.name} – ${d.b.name}: exact ground state (multipole order ${d.order}) and asymptotic forms`, { 'text-anchor': 'middle', 'font-size': 15 }),
    legendRow(key, W / 2, 56),
    chartPanel({ x: { kind: 'log', label: xLabel }, y: { kind: 'log', label: '|μ_{z}| (e a_{0})' }, series: dipoleSeries, tag: '(a)' }, { ...left, ...top }, 'dipole'),
    chartPanel({ x: { kind: 'log', label: xLabel }, y: { kind: 'log', label: '−ΔE (E_{h})' }, series: energySeries, tag: '(b)' }, { ...right, ...top }, 'energy'),
    chartPanel({ x: { kind: 'log', label: xLabel }, y: { kind: 'linear', label: `μ ÷ (${dipoleLaw})` }, series: ratioSeries, tag: '(c)' }, { ...left, ...bottom }, 'dipole-ratio'),
    chartPanel({ x: { kind: 'log', label: xLabel }, y: { kind: 'linear', label: '−ΔE ÷ asymptotic form' }, series: energyRatio, tag: '(d)' }, { ...right, ...bottom }, 'energy-ratio'),
    text(W / 2, H - 14, `A at the origin, B at +R on z; μ along z. Asymptotic coefficients from the perturbation route; (c), (d): exact ÷ asymptotic form.`, { 'text-anchor': 'middle', 'font-size': 11, fill: '#444444' }),
  ];
  return svgDocument(W, H, body, `${d.a.name}–${d.b.name} induced dipoles and interaction energy`);
}
