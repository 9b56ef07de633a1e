/**
 * The figure of `dispole curve --svg`, in the house style (house-style.ts): (a) log–log |mu_z| of each centre and
 * of the pair against R with the asymptotic forms |D7|/R^7 dashed, (b) log–log −ΔE against R with
 * −C6/R^6 − C8/R^8 dashed and the leading C6/R^6 dotted, (c), (d) exact ÷ asymptotic form. Exact values are solid
 * lines with a marker shape per centre; untrusted points are open markers, never joined to the line; the
 * asymptotic forms are drawn above the data. Each panel has its own legend. Units follow the report: atomic
 * (e·a0, hartree) or SI (debye, --energy-unit), R in the length unit of the data.
 */
import { dipoleAuToDebye, energyFromHartree, energyUnitText } from '../../model/units.js';
import { asymptoticForms, SERIES_RANGE, toUnit, unitName, type CurveData, type CurveUnits } from '../curve-report.js';
import { chartPanel, legendHeight, type PanelSpec, type Series } from './chart-panel.js';
import { ALERT, DASH, MUTED_INK, SERIES_COLOURS, SERIES_MARKERS } from './house-style.js';
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
export function curveFigure(d: CurveData, units: CurveUnits = {}): string {
  const si = units.units === 'si';
  const eu = units.energyUnit ?? 'cm-1';
  const mu = si ? dipoleAuToDebye : (x: number) => x;
  const en = si ? (x: number) => energyFromHartree(x, eu) : (x: number) => x;
  const muUnit = si ? 'D' : 'e a_{0}';
  const eUnit = si ? energyUnitText(eu).replace('^-1', '^{-1}') : 'E_{h}';
  const W = 1000;
  const xLabel = `R (${unitName(d.lengthUnit)})`;
  const c = d.coefficients;
  const hollow = d.rows.map((r) => !r.trusted);
  const x = d.rows.map((r) => toUnit(r.R, d.lengthUnit));
  const scale = Math.max(...d.rows.map((r) => Math.max(Math.abs(r.muA), Math.abs(r.muB))));
  const showTotal = d.rows.some((r) => Math.abs(r.muTotal) > 1e-9 * scale);
  // the asymptotic series through R^-9 (dipole) and R^-8 (energy), as in the text report
  const dipoleLaw = [c.D4 && 'D_{4}/R^{4}', c.D6 && 'D_{6}/R^{6}', 'D_{7}/R^{7}', c.D8 && 'D_{8}/R^{8}', c.D9 && 'D_{9}/R^{9}', c.D10 && 'D_{10}/R^{10}'].filter(Boolean).join(' + ');
  const energyLaw = [c.E5 !== undefined && '−E_{5}/R^{5}', 'C_{6}/R^{6}', c.E7 !== undefined && '−E_{7}/R^{7}', c.C8 !== undefined && 'C_{8}/R^{8}'].filter(Boolean).join(' + ');
  // ratio panels: points the series does not describe (R too small) are drawn open and not joined either
  const offSeries = d.rows.map((r) => !r.trusted || !r.inSeries);
  const flagged = d.completeness.notes.length > 0;

  const centres = [
    { key: 'muA' as const, name: d.a.name, sym: 'μ_{A,z}', colour: SERIES_COLOURS[0], shape: SERIES_MARKERS[0], d7: c.D7.a },
    { key: 'muB' as const, name: d.b.name, sym: 'μ_{B,z}', colour: SERIES_COLOURS[1], shape: SERIES_MARKERS[1], d7: c.D7.b },
    ...(showTotal ? [{ key: 'muTotal' as const, name: 'pair', sym: 'μ_{A,z}+μ_{B,z}', colour: SERIES_COLOURS[2], shape: SERIES_MARKERS[2], d7: c.D7.total }] : []),
  ];
  const exact = (label: string, colour: string, shape: Series['shape'], y: (i: number) => number, open: readonly boolean[] = hollow): Series => ({
    label,
    points: d.rows.map((_, i) => [x[i], y(i)] as [number, number]),
    colour,
    shape,
    markers: true,
    hollow: open,
    detached: open,
  });
  const model = (label: string, colour: string, points: Array<[number, number]>, dash: string = DASH.model): Series => ({ label, points, colour, dash, width: 1.3, layer: 'model' });
  const unity: Series = { label: '', points: [[x[0], 1], [x[x.length - 1], 1]], colour: MUTED_INK, dash: DASH.reference, width: 1, layer: 'model' };

  const dipole: PanelSpec = {
    x: { kind: 'log', label: xLabel },
    y: { kind: 'log', label: `|μ_{z}| (${muUnit})` },
    series: [
      ...centres.map((s) => exact(`${s.sym} ${s.name} (${s.d7 < 0 ? '< 0' : '> 0'})`, s.colour, s.shape, (i) => Math.abs(mu(d.rows[i][s.key])))),
      ...centres.map((s, k) => model(k === 0 ? `|${dipoleLaw}|` : '', s.colour, smooth(d, (R) => Math.abs(mu(asymptoticForms(c, R)[s.key]))))),
    ],
    tag: 'a',
    subject: 'induced dipoles',
  };
  const energy: PanelSpec = {
    x: { kind: 'log', label: xLabel },
    y: { kind: 'log', label: `−ΔE (${eUnit})` },
    series: [
      exact('exact −ΔE', SERIES_COLOURS[0], SERIES_MARKERS[0], (i) => -en(d.rows[i].energy)),
      model(energyLaw, SERIES_COLOURS[1], smooth(d, (R) => -en(asymptoticForms(c, R).energy))),
      model('C_{6}/R^{6}', MUTED_INK, smooth(d, (R) => en(c.C6 / R ** 6)), DASH.reference),
    ],
    tag: 'b',
    subject: 'interaction energy',
  };
  const dipoleRatio: PanelSpec = {
    x: { kind: 'log', label: xLabel },
    y: { kind: 'linear', label: `μ ÷ (${dipoleLaw})` },
    series: [unity, ...centres.map((s) => exact(s.sym, s.colour, s.shape, (i) => d.rows[i][s.key] / d.rows[i].asymptotic[s.key], offSeries))],
    tag: 'c',
    subject: 'dipoles ÷ asymptotic form',
  };
  const energyRatio: PanelSpec = {
    x: { kind: 'log', label: xLabel },
    y: { kind: 'linear', label: '−ΔE ÷ asymptotic form' },
    series: [
      unity,
      exact(`÷ (${energyLaw})`, SERIES_COLOURS[1], SERIES_MARKERS[1], (i) => d.rows[i].energy / d.rows[i].asymptotic.energy, offSeries),
      exact('÷ C_{6}/R^{6}', SERIES_COLOURS[2], SERIES_MARKERS[2], (i) => -d.rows[i].energy / (c.C6 / d.rows[i].R ** 6), offSeries),
    ],
    tag: 'd',
    subject: 'energy ÷ asymptotic forms',
  };

  const left = { x: 110, width: 350 }, right = { x: 615, width: 350 };
  const panelWidth = left.width;
  const topLegend = Math.max(legendHeight(dipole, panelWidth), legendHeight(energy, panelWidth));
  const bottomLegend = Math.max(legendHeight(dipoleRatio, panelWidth), legendHeight(energyRatio, panelWidth));
  const top = { y: 84 + topLegend, height: 300 };
  const bottom = { y: top.y + top.height + 90 + bottomLegend, height: 220 };
  const H = bottom.y + bottom.height + 116;
  const untrusted = d.rows.some((r) => !r.trusted);
  const body = [
    text(40, 28, `${d.a.name} – ${d.b.name}: exact ground state (multipole order ${d.order}) and asymptotic forms`, { 'font-size': 16 }),
    ...(flagged
      ? [text(40, 48, `FLAGGED: at multipole order ${d.order} the exact ${[d.completeness.dipoleVanishes ? 'μ (zero by symmetry)' : d.completeness.dipoleMissing.length ? `μ (lacks ${d.completeness.dipoleMissing.join(', ')})` : '', d.completeness.energyMissing.length ? `ΔE (lacks ${d.completeness.energyMissing.join(', ')})` : ''].filter(Boolean).join(' and ')} is not right to the order of the series`, { 'font-size': 12, fill: ALERT })]
      : []),
    chartPanel(dipole, { ...left, ...top }, 'dipole'),
    chartPanel(energy, { ...right, ...top }, 'energy'),
    chartPanel(dipoleRatio, { ...left, ...bottom }, 'dipole-ratio'),
    chartPanel(energyRatio, { ...right, ...bottom }, 'energy-ratio'),
    text(40, H - 52, 'A at the origin, B at +R on z; μ along z. Solid with markers: exact; dashed: asymptotic forms (perturbation route), drawn above the data.', { 'font-size': 11, fill: MUTED_INK }),
    text(40, H - 36, `${untrusted ? 'Open markers: UNTRUSTED points, not joined to the line. ' : ''}${offSeries.some((o, i) => o && d.rows[i].trusted) ? `In (c), (d) points more than ${SERIES_RANGE * 100}% off the series are open and not joined.` : ''}`, { 'font-size': 11, fill: MUTED_INK }),
    text(40, H - 20, `Units: R in ${unitName(d.lengthUnit)}, μ in ${si ? 'debye' : 'e a0'}, energies in ${si ? energyUnitText(eu) : 'hartree'}${si ? ' (CODATA 2018)' : ''}.`, { 'font-size': 11, fill: MUTED_INK }),
  ];
  return svgDocument(W, H, body, `${d.a.name}–${d.b.name} induced dipoles and interaction energy`);
}
