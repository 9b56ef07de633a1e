/**
 * One x–y chart panel in the house style (src/report/svg/house-style.ts): open axes on the left and bottom with
 * outward ticks, faint guide lines at the labelled y values, axis titles with units, clipped curves with marker
 * shapes and dashes (model curves drawn above the data; untrusted points never joined to the line), a tag and
 * subject above the panel and the panel's own unframed legend in a row between them and the plot area.
 */
import { el, pathThrough, px, text, type Attrs } from './svg-markup.js';
import { makeScale, niceDomain, type Scale, type ScaleKind } from './scales.js';
import { CHAR_WIDTH, FONT_SIZE, GUIDE, INK, MUTED_INK, PANEL, PAPER, type MarkerShape } from './house-style.js';

export interface Series {
  /** Rich-text legend label; empty to leave the series out of the legend. */
  label: string;
  points: ReadonlyArray<readonly [number, number]>;
  colour: string;
  /** SVG stroke-dasharray, e.g. "7 4"; solid when absent. */
  dash?: string;
  width?: number;
  /** Draw a marker at every point; `hollow[i]` draws an open marker (e.g. an untrusted value). */
  markers?: boolean;
  hollow?: readonly boolean[];
  /** Marker shape (default circle). */
  shape?: MarkerShape;
  /** Points never joined to the line (e.g. untrusted values): drawn as markers only. */
  detached?: readonly boolean[];
  /** "model" curves (asymptotic forms, references) are drawn above the data. */
  layer?: 'data' | 'model';
}

export interface AxisSpec {
  kind: ScaleKind;
  /** Rich-text title with units, e.g. `R (bohr)`. */
  label: string;
  /** Fixed domain; otherwise taken from the data and rounded outward. */
  domain?: [number, number];
}

export interface PanelSpec {
  x: AxisSpec;
  y: AxisSpec;
  series: readonly Series[];
  /** Panel tag drawn above the top-left corner, e.g. "a", followed by `subject`. */
  tag?: string;
  subject?: string;
  /** Extra rich-text lines drawn under the legend. */
  notes?: readonly string[];
}

export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

const FONT = FONT_SIZE;
/** Rough width of rich text in the house font at `size` px (markup characters do not count). */
export const textWidth = (label: string, size = FONT): number => label.replace(/[\^_]\{([^}]*)\}/g, '$1').length * size * CHAR_WIDTH;

/** A marker of `shape` centred on (x, y); open markers are filled with paper. */
export function marker(shape: MarkerShape, x: number, y: number, colour: string, open = false): string {
  const r = PANEL.markerRadius;
  const paint = { fill: open ? PAPER : colour, stroke: colour, 'stroke-width': 1.2 };
  switch (shape) {
    case 'square':
      return el('rect', { x: x - r * 0.9, y: y - r * 0.9, width: 1.8 * r, height: 1.8 * r, ...paint });
    case 'triangle':
      return el('path', { d: `M${px(x)} ${px(y - 1.15 * r)}L${px(x + r)} ${px(y + 0.75 * r)}L${px(x - r)} ${px(y + 0.75 * r)}Z`, ...paint });
    case 'diamond':
      return el('path', { d: `M${px(x)} ${px(y - 1.2 * r)}L${px(x + 1.2 * r)} ${px(y)}L${px(x)} ${px(y + 1.2 * r)}L${px(x - 1.2 * r)} ${px(y)}Z`, ...paint });
    default:
      return el('circle', { cx: x, cy: y, r, ...paint });
  }
}

function usable(kind: ScaleKind, v: number): boolean {
  return Number.isFinite(v) && (kind === 'linear' || v > 0);
}

function dataDomain(axis: AxisSpec, values: number[]): [number, number] {
  if (axis.domain) return axis.domain;
  const ok = values.filter((v) => usable(axis.kind, v));
  if (ok.length === 0) return axis.kind === 'log' ? [0.1, 10] : [0, 1];
  return niceDomain(axis.kind, Math.min(...ok), Math.max(...ok));
}

function axisTicks(scale: Scale, horizontal: boolean, box: Box): string[] {
  const out: string[] = [];
  for (const t of scale.ticks()) {
    const p = scale.map(t.value);
    const len = t.major ? PANEL.tick : PANEL.minorTick;
    if (horizontal) {
      out.push(el('path', { d: `M${px(p)} ${px(box.y + box.height)}v${len}`, stroke: INK, 'stroke-width': PANEL.axisWidth }));
      if (t.label) out.push(text(p, box.y + box.height + FONT + 7, t.label, { 'text-anchor': 'middle' }));
    } else {
      out.push(el('path', { d: `M${px(box.x)} ${px(p)}h${-len}`, stroke: INK, 'stroke-width': PANEL.axisWidth }));
      if (t.label) out.push(text(box.x - 8, p + FONT * 0.35, t.label, { 'text-anchor': 'end' }));
    }
  }
  return out;
}

/** Faint horizontal guide lines at the labelled y values (drawn under the data). */
function guides(scale: Scale, box: Box): string[] {
  return scale
    .ticks()
    .filter((t) => t.label)
    .map((t) => el('path', { d: `M${px(box.x)} ${px(scale.map(t.value))}h${px(box.width)}`, stroke: GUIDE, 'stroke-width': PANEL.guideWidth }));
}

/** A legend entry: line sample, optional marker, label. */
type LegendEntry = Pick<Series, 'label' | 'colour' | 'dash' | 'width' | 'markers' | 'shape'> & { open?: boolean };

const entryWidth = (s: LegendEntry) => 32 + textWidth(s.label) + 18;

/**
 * Legend rows (line sample, marker, label per entry), unframed, starting at (x, y) and wrapping at `maxWidth`;
 * returns the markup and the number of rows.
 */
export function legendRows(entries: readonly LegendEntry[], x: number, y: number, maxWidth: number): { markup: string; rows: number } {
  const items: string[] = [];
  let cx = x, cy = y, rows = entries.length ? 1 : 0;
  for (const s of entries) {
    if (cx > x && cx + entryWidth(s) - 18 > x + maxWidth) {
      cx = x;
      cy += PANEL.legendRow;
      rows++;
    }
    items.push(el('path', { d: `M${px(cx)} ${px(cy)}h24`, stroke: s.colour, 'stroke-width': s.width ?? PANEL.lineWidth, 'stroke-dasharray': s.dash, fill: 'none' }));
    if (s.markers) items.push(marker(s.shape ?? 'circle', cx + 12, cy, s.colour, s.open));
    items.push(text(cx + 30, cy + FONT * 0.35, s.label, { 'font-size': FONT - 1 }));
    cx += entryWidth(s);
  }
  return { markup: el('g', {}, items), rows };
}

/** Height the legend of `spec` takes above a panel of width `width` (for layout). */
export function legendHeight(spec: PanelSpec, width: number): number {
  const entries = spec.series.filter((s) => s.label);
  return legendRows(entries, 0, 0, width).rows * PANEL.legendRow;
}

/**
 * Draw one panel into `box` (the plot area; axes, labels, tag and legend go outside it). The legend takes
 * {@link legendHeight} above the box, the tag a line above that. `id` must be unique in the document.
 */
export function chartPanel(spec: PanelSpec, box: Box, id: string): string {
  const xs = dataDomain(spec.x, spec.series.flatMap((s) => s.points.map((p) => p[0])));
  const ys = dataDomain(spec.y, spec.series.flatMap((s) => s.points.filter((p) => usable(spec.x.kind, p[0]) && p[0] >= xs[0] && p[0] <= xs[1]).map((p) => p[1])));
  const sx = makeScale(spec.x.kind, xs, [box.x, box.x + box.width]);
  const sy = makeScale(spec.y.kind, ys, [box.y + box.height, box.y]);
  const map = (p: readonly [number, number]): [number, number] =>
    usable(spec.x.kind, p[0]) && usable(spec.y.kind, p[1]) ? [sx.map(p[0]), sy.map(p[1])] : [NaN, NaN];
  const parts: string[] = [];
  parts.push(el('defs', {}, el('clipPath', { id: `${id}-clip` }, el('rect', { x: box.x - 4, y: box.y - 4, width: box.width + 8, height: box.height + 8 }))));
  parts.push(...guides(sy, box));

  const layers: Record<'data' | 'model', string[]> = { data: [], model: [] };
  for (const s of spec.series) {
    const pts = s.points.map(map);
    const joined = pts.map((p, i) => (s.detached?.[i] ? ([NaN, NaN] as [number, number]) : p));
    const layer = layers[s.layer ?? 'data'];
    layer.push(el('path', { d: pathThrough(joined), fill: 'none', stroke: s.colour, 'stroke-width': s.width ?? PANEL.lineWidth, 'stroke-linejoin': 'round', 'stroke-dasharray': s.dash }));
    if (s.markers)
      pts.forEach(([x, y], i) => {
        if (Number.isFinite(x)) layer.push(marker(s.shape ?? 'circle', x, y, s.colour, s.hollow?.[i] ?? false));
      });
  }
  parts.push(el('g', { 'clip-path': `url(#${id}-clip)` }, [...layers.data, ...layers.model]));

  // open axes, outward ticks, titles
  const bottom = box.y + box.height;
  parts.push(el('path', { d: `M${px(box.x)} ${px(box.y)}V${px(bottom)}H${px(box.x + box.width)}`, fill: 'none', stroke: INK, 'stroke-width': PANEL.axisWidth }));
  parts.push(...axisTicks(sx, true, box), ...axisTicks(sy, false, box));
  parts.push(text(box.x + box.width / 2, bottom + 2 * FONT + 16, spec.x.label, { 'text-anchor': 'middle' }));
  const yTitleX = box.x - 62;
  parts.push(text(yTitleX, box.y + box.height / 2, spec.y.label, { 'text-anchor': 'middle', transform: `rotate(-90 ${px(yTitleX)} ${px(box.y + box.height / 2)})` }));

  // legend row(s) right above the plot area, tag and subject above the legend
  const entries = spec.series.filter((s) => s.label).map((s) => ({ ...s, open: false }));
  const height = legendHeight(spec, box.width);
  if (entries.length) parts.push(legendRows(entries, box.x, box.y - height + PANEL.legendRow / 2 - 6, box.width).markup);
  if (spec.tag || spec.subject) {
    const y = box.y - height - 12;
    parts.push(text(box.x - 62, y, `${spec.tag ?? ''}`, { 'font-size': FONT + 2 }));
    if (spec.subject) parts.push(text(box.x - 44, y, spec.subject, { fill: MUTED_INK }));
  }
  for (const [i, n] of (spec.notes ?? []).entries()) parts.push(text(box.x + 8, box.y + 14 + i * (FONT + 4), n, { 'font-size': FONT - 2, fill: MUTED_INK }));
  return el('g', {}, parts);
}
