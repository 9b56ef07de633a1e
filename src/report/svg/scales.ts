/**
 * Axis scales (linear and logarithmic) and their tick marks. Linear ticks use the 1–2–5 steps; logarithmic
 * axes put labelled ticks at decades (every k-th decade when there are many) and minor ticks at 2…9 × 10^n
 * (common practice for scientific plots).
 */

export type ScaleKind = 'linear' | 'log';

export interface Tick {
  value: number;
  /** Rich-text label (see svg-markup richText), empty for a minor tick. */
  label: string;
  major: boolean;
}

export interface Scale {
  kind: ScaleKind;
  domain: [number, number];
  range: [number, number];
  /** Data value → pixel. */
  map(v: number): number;
  ticks(): Tick[];
}

/** 1, 2 or 5 × 10^k closest above `raw`. */
function niceStep(raw: number): number {
  const p = 10 ** Math.floor(Math.log10(raw));
  const f = raw / p;
  return (f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10) * p;
}

/** Label of a linear tick: plain decimals, or m·10^k for very large/small steps. */
function linearLabel(v: number, step: number): string {
  if (Math.abs(v) < step * 1e-9) return '0';
  const e = Math.floor(Math.log10(step));
  if (e >= -3 && e <= 4) return v.toFixed(Math.max(0, -e)).replace('-', '−');
  const k = Math.floor(Math.log10(Math.abs(v)));
  const m = Number((v / 10 ** k).toPrecision(3));
  return `${m === 1 ? '' : m === -1 ? '−' : `${String(m).replace('-', '−')}×`}10^{${k}}`;
}

/** Round a domain outward to nice numbers (linear) or whole decades when it spans more than one (log). */
export function niceDomain(kind: ScaleKind, lo: number, hi: number): [number, number] {
  if (kind === 'log') {
    const a = Math.log10(lo), b = Math.log10(hi);
    if (b - a >= 1.5) return [10 ** Math.floor(a + 1e-9), 10 ** Math.ceil(b - 1e-9)];
    const pad = Math.max(0.02, 0.04 * (b - a));
    return [10 ** (a - pad), 10 ** (b + pad)];
  }
  if (hi === lo) return [lo - 1, hi + 1];
  const step = niceStep((hi - lo) / 5);
  return [Math.floor(lo / step + 1e-9) * step, Math.ceil(hi / step - 1e-9) * step];
}

export function makeScale(kind: ScaleKind, domain: [number, number], range: [number, number]): Scale {
  const [d0, d1] = domain, [r0, r1] = range;
  const t = kind === 'log' ? (v: number) => Math.log10(v) : (v: number) => v;
  const t0 = t(d0), t1 = t(d1);
  const map = (v: number) => r0 + ((t(v) - t0) / (t1 - t0)) * (r1 - r0);
  const ticks = (): Tick[] => {
    const out: Tick[] = [];
    if (kind === 'linear') {
      const step = niceStep((d1 - d0) / 6);
      for (let k = Math.ceil(d0 / step - 1e-9); k * step <= d1 + step * 1e-9; k++) out.push({ value: k * step, label: linearLabel(k * step, step), major: true });
      return out;
    }
    const lo = Math.floor(t0 + 1e-9), hi = Math.ceil(t1 - 1e-9);
    const span = t1 - t0;
    // which multiples m × 10^e get a label, by how many decades the axis spans
    const labelled = span < 0.7 ? [1, 2, 3, 4, 5, 6, 7, 8, 9] : span < 1.6 ? [1, 2, 3, 5] : span < 3 ? [1, 2, 5] : [1];
    const every = span > 16 ? 4 : span > 8 ? 2 : 1;
    const plain = d0 >= 1e-3 && d1 < 1e5; // small plain numbers read better than powers
    const label = (m: number, e: number) => (plain ? String(Number((m * 10 ** e).toPrecision(6))) : m === 1 ? `10^{${e}}` : `${m}×10^{${e}}`);
    for (let e = lo - 1; e <= hi; e++)
      for (let m = 1; m <= 9; m++) {
        const v = m * 10 ** e;
        if (v < d0 * (1 - 1e-9) || v > d1 * (1 + 1e-9)) continue;
        if (m > 1 && span > 8) continue; // no minor ticks on very long axes
        const show = labelled.includes(m) && (m > 1 || e % every === 0);
        out.push({ value: v, label: show ? label(m, e) : '', major: m === 1 || show });
      }
    return out;
  };
  return { kind, domain, range, map, ticks };
}
