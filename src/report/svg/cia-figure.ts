/**
 * The figure of `dispole cia --svg`, in the house style (house-style.ts): (a) the potential V(R), (b) the dipole
 * function mu(R) along +z (A at the origin, B at +R on z), and with a spectrum (c) the absorption coefficient per
 * amagat² against wavenumber at each temperature (log scale). Atomic units for V and mu, cm^-1 for the spectra.
 */
import type { CiaResult } from '../../engines/cia/cia.js';
import { chartPanel, legendHeight, type PanelSpec, type Series } from './chart-panel.js';
import { DASH, MUTED_INK, SERIES_COLOURS, SERIES_MARKERS } from './house-style.js';
import { svgDocument, text } from './svg-markup.js';

/** The whole SVG document. */
export function ciaFigure(r: CiaResult): string {
  const W = 1000;
  const { R, V, mu } = r.curves;
  const depth = r.potential.well?.depth ?? Math.max(...V.map(Math.abs));
  const inView = R.map((_, i) => V[i] <= 3 * depth);
  const potential: PanelSpec = {
    x: { kind: 'linear', label: 'R (bohr)' },
    y: { kind: 'linear', label: 'V (E_{h})', domain: [-1.2 * depth, 3 * depth] },
    series: [
      { label: 'V(R)', points: R.map((x, i) => [x, V[i]] as [number, number]).filter((_, i) => inView[i]), colour: SERIES_COLOURS[0] },
      { label: '', points: [[R[0], 0], [R[R.length - 1], 0]], colour: MUTED_INK, dash: DASH.reference, width: 1, layer: 'model' },
    ],
    tag: 'a',
    subject: 'pair potential',
  };
  const dipole: PanelSpec = {
    x: { kind: 'linear', label: 'R (bohr)' },
    y: { kind: 'linear', label: 'μ_{z} (e a_{0})' },
    series: [
      { label: 'μ(R), A at 0, B at +R ẑ', points: R.map((x, i) => [x, mu[i]] as [number, number]), colour: SERIES_COLOURS[1] },
      { label: '', points: [[R[0], 0], [R[R.length - 1], 0]], colour: MUTED_INK, dash: DASH.reference, width: 1, layer: 'model' },
    ],
    tag: 'b',
    subject: 'induced dipole',
  };
  const spectra = r.temperatures.filter((t) => t.spectrum);
  const spectrum: PanelSpec | undefined = spectra.length
    ? {
        x: { kind: 'linear', label: 'ν̃ (cm^{-1})' },
        y: { kind: 'log', label: 'α/(n_{1}n_{2}) (cm^{-1} amagat^{-2})' },
        series: spectra.map((t, k): Series => ({
          label: `${t.T} K`,
          points: t.spectrum!.wavenumber.map((w, i) => [w, t.spectrum!.absorption[i]] as [number, number]).filter(([, y]) => y > 0),
          colour: SERIES_COLOURS[k % SERIES_COLOURS.length],
          shape: SERIES_MARKERS[k % SERIES_MARKERS.length],
        })),
        tag: 'c',
        subject: 'absorption spectrum (quantum line shape)',
      }
    : undefined;
  const left = { x: 110, width: 350 }, right = { x: 615, width: 350 };
  const top = { y: 70 + Math.max(legendHeight(potential, left.width), legendHeight(dipole, right.width)), height: 260 };
  const bottom = spectrum ? { y: top.y + top.height + 90 + legendHeight(spectrum, 855), height: 280 } : undefined;
  const H = (bottom ? bottom.y + bottom.height : top.y + top.height) + 90;
  const body = [
    text(40, 28, `${r.pair.A} – ${r.pair.B}: collision-induced absorption`, { 'font-size': 16 }),
    chartPanel(potential, { ...left, ...top }, 'potential'),
    chartPanel(dipole, { ...right, ...top }, 'dipole'),
    ...(spectrum && bottom ? [chartPanel(spectrum, { x: left.x, width: 855, ...bottom }, 'spectrum')] : []),
    text(40, H - 30, `Potential: ${r.potential.label}`, { 'font-size': 11, fill: MUTED_INK }),
    text(40, H - 14, `Dipole: ${r.dipole.convention}. ${r.trusted ? '' : 'UNTRUSTED: a quantum sum did not converge.'}`, { 'font-size': 11, fill: MUTED_INK }),
  ];
  return svgDocument(W, H, body, `${r.pair.A}–${r.pair.B} collision-induced absorption`);
}
