/**
 * One x–y chart panel in the style of a journal figure: a closed frame with inward ticks on all four sides,
 * labelled ticks on the left and bottom, axis titles with units, clipped curves with optional markers and
 * dashes, and a legend placed in the corner that covers the fewest data points.
 */
import { el, pathThrough, px, text, type Attrs } from './svg-markup.js';
import { makeScale, niceDomain, type Scale, type ScaleKind } from './scales.js';

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
  /** Panel tag drawn in the top-left corner, e.g. "(a)". */
  tag?: string;
  /** Extra rich-text lines drawn under the legend. */
  notes?: readonly string[];
}

export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

const FONT = 13;
/** Rough width of rich text in DejaVu Sans at `size` px (markup characters do not count). */
export const textWidth = (label: string, size = FONT): number => label.replace(/[\^_]\{([^}]*)\}/g, '$1').length * size * 0.6;

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
    const len = t.major ? 6 : 3.5;
    if (horizontal) {
      out.push(el('path', { d: `M${px(p)} ${px(box.y + box.height)}v${-len}M${px(p)} ${px(box.y)}v${len}`, stroke: '#000', 'stroke-width': 0.9 }));
      if (t.label) out.push(text(p, box.y + box.height + FONT + 5, t.label, { 'text-anchor': 'middle' }));
    } else {
      out.push(el('path', { d: `M${px(box.x)} ${px(p)}h${len}M${px(box.x + box.width)} ${px(p)}h${-len}`, stroke: '#000', 'stroke-width': 0.9 }));
      if (t.label) out.push(text(box.x - 6, p + FONT * 0.35, t.label, { 'text-anchor': 'end' }));
    }
  }
  return out;
}

/** A one-line legend (line sample, optional marker, label per entry) centred on (x, y), e.g. above a row of panels. */
export function legendRow(entries: ReadonlyArray<Pick<Series, 'label' | 'colour' | 'dash' | 'width' | 'markers'> & { open?: boolean }>, x: number, y: number): string {
  const items: string[] = [];
  const total = entries.reduce((w, s) => w + 54 + textWidth(s.label), -22);
  let cx = x - total / 2;
  for (const s of entries) {
    items.push(el('path', { d: `M${px(cx)} ${px(y)}h26`, stroke: s.colour, 'stroke-width': s.width ?? 1.6, 'stroke-dasharray': s.dash, fill: 'none' }));
    if (s.markers) items.push(el('circle', { cx: cx + 13, cy: y, r: 2.6, fill: s.open ? '#ffffff' : s.colour, stroke: s.colour, 'stroke-width': 1.1 }));
    items.push(text(cx + 32, y + FONT * 0.35, s.label));
    cx += 32 + textWidth(s.label) + 22;
  }
  return el('g', {}, items);
}

/** Draw one panel into `box` (the frame; labels go outside it). `id` must be unique in the document. */
export function chartPanel(spec: PanelSpec, box: Box, id: string): string {
  const xs = dataDomain(spec.x, spec.series.flatMap((s) => s.points.map((p) => p[0])));
  const ys = dataDomain(spec.y, spec.series.flatMap((s) => s.points.filter((p) => usable(spec.x.kind, p[0]) && p[0] >= xs[0] && p[0] <= xs[1]).map((p) => p[1])));
  const sx = makeScale(spec.x.kind, xs, [box.x, box.x + box.width]);
  const sy = makeScale(spec.y.kind, ys, [box.y + box.height, box.y]);
  const map = (p: readonly [number, number]): [number, number] =>
    usable(spec.x.kind, p[0]) && usable(spec.y.kind, p[1]) ? [sx.map(p[0]), sy.map(p[1])] : [NaN, NaN];
  const parts: string[] = [];
  parts.push(el('defs', {}, el('clipPath', { id: `${id}-clip` }, el('rect', { x: box.x, y: box.y, width: box.width, height: box.height }))));

  const curves: string[] = [];
  const marks: string[] = [];
  const screen: Array<[number, number]> = [];
  for (const s of spec.series) {
    const pts = s.points.map(map);
    screen.push(...pts.filter((p) => Number.isFinite(p[0])));
    const attrs: Attrs = { d: pathThrough(pts), fill: 'none', stroke: s.colour, 'stroke-width': s.width ?? 1.6, 'stroke-linejoin': 'round', 'stroke-dasharray': s.dash };
    curves.push(el('path', attrs));
    if (s.markers)
      pts.forEach(([x, y], i) => {
        if (!Number.isFinite(x)) return;
        const open = s.hollow?.[i] ?? false;
        marks.push(el('circle', { cx: x, cy: y, r: 2.6, fill: open ? '#ffffff' : s.colour, stroke: s.colour, 'stroke-width': 1.1 }));
      });
  }
  parts.push(el('g', { 'clip-path': `url(#${id}-clip)` }, [...curves, ...marks]));

  // frame, ticks, titles
  parts.push(el('rect', { x: box.x, y: box.y, width: box.width, height: box.height, fill: 'none', stroke: '#000', 'stroke-width': 1.1 }));
  parts.push(...axisTicks(sx, true, box), ...axisTicks(sy, false, box));
  parts.push(text(box.x + box.width / 2, box.y + box.height + 2 * FONT + 14, spec.x.label, { 'text-anchor': 'middle', 'font-size': FONT + 1 }));
  const yTitleX = box.x - 58;
  parts.push(text(yTitleX, box.y + box.height / 2, spec.y.label, { 'text-anchor': 'middle', 'font-size': FONT + 1, transform: `rotate(-90 ${px(yTitleX)} ${px(box.y + box.height / 2)})` }));
  if (spec.tag) parts.push(text(box.x - 4, box.y - 9, spec.tag, { 'font-weight': 'bold', 'font-size': FONT + 1 }));

  // legend in the emptiest corner
  const entries = spec.series.filter((s) => s.label);
  const notes = spec.notes ?? [];
  if (entries.length + notes.length > 0) {
    const lineH = FONT + 6;
    const w = 38 + Math.max(...entries.map((s) => textWidth(s.label)), ...notes.map((n) => textWidth(n, FONT - 1)), 40);
    const h = lineH * (entries.length + notes.length) + 8;
    const pad = 10;
    const corners: Array<[number, number]> = [
      [box.x + box.width - w - pad, box.y + pad],
      [box.x + pad, box.y + pad],
      [box.x + box.width - w - pad, box.y + box.height - h - pad],
      [box.x + pad, box.y + box.height - h - pad],
    ];
    const covered = ([lx, ly]: [number, number]) => screen.filter(([x, y]) => x >= lx - 4 && x <= lx + w + 4 && y >= ly - 4 && y <= ly + h + 4).length;
    const [lx, ly] = corners.reduce((best, c) => (covered(c) < covered(best) ? c : best));
    const items: string[] = [el('rect', { x: lx, y: ly, width: w, height: h, fill: '#ffffff', 'fill-opacity': 0.9, stroke: '#999999', 'stroke-width': 0.6 })];
    entries.forEach((s, i) => {
      const cy = ly + 4 + lineH * (i + 0.5);
      items.push(el('path', { d: `M${px(lx + 8)} ${px(cy)}h26`, stroke: s.colour, 'stroke-width': s.width ?? 1.6, 'stroke-dasharray': s.dash, fill: 'none' }));
      if (s.markers) items.push(el('circle', { cx: lx + 21, cy, r: 2.6, fill: s.colour, stroke: s.colour }));
      items.push(text(lx + 40, cy + FONT * 0.35, s.label));
    });
    notes.forEach((n, i) => items.push(text(lx + 8, ly + 4 + lineH * (entries.length + i + 0.5) + FONT * 0.35, n, { 'font-size': FONT - 1, fill: '#333333' })));
    parts.push(el('g', {}, items));
  }
  return el('g', {}, parts);
}
