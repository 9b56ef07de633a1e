/**
 * Cluster geometries in the XYZ format (the open de facto standard of molecular programs):
 *
 *   3                         ← line 1: the number of centres
 *   an invented triangle      ← line 2: a comment (may be empty)
 *   Quelon  0.0  0.0  0.0     ← one line per centre: label x y z (ångström unless told otherwise); a fifth
 *   …                           column (extended XYZ files carry one, e.g. a charge) is accepted and ignored
 *
 * Pure: takes the file's text; the CLI reads the file. Positions are returned in bohr. Errors name the file and
 * the line (`file.xyz:4`) and say what was expected.
 */
import type { Vec3 } from './types.js';
import { InputError } from './errors.js';
import { angstromToBohr } from './units.js';

/** One centre of a geometry. */
export interface GeometryCentre {
  /** The label of the XYZ line (resolved to a species by the caller). */
  label: string;
  /** Position, bohr. */
  position: Vec3;
  /** 1-based line number in the file, for error messages. */
  line: number;
}

export interface Geometry {
  comment: string;
  centres: GeometryCentre[];
}

export interface XyzOptions {
  /** Unit of the coordinates in the file (default ångström). */
  unit?: 'angstrom' | 'bohr';
  /** Name used in error messages (default "geometry"). */
  fileName?: string;
  /** Centres closer than this (bohr) are reported as coinciding. Default 1e-3 bohr. */
  minSeparation?: number;
  /** Refuse, before reading the centres, a file announcing more than `count` of them; `why` ends the message. */
  maxCentres?: { count: number; why: string };
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eEdD][+-]?\d+)?$/;

/** Parse an XYZ file's text into labelled centres (positions in bohr). */
export function parseXyz(text: string, options: XyzOptions = {}): Geometry {
  const file = options.fileName ?? 'geometry';
  const toBohr = options.unit === 'bohr' ? (x: number) => x : angstromToBohr;
  const lines = text.split(/\r?\n/);
  const at = (line: number) => `${file}:${line}`;

  const countText = (lines[0] ?? '').trim();
  if (countText === '') throw new InputError(at(1), 'expected the number of centres on the first line (XYZ format), found an empty line');
  if (!/^\d+$/.test(countText) || Number(countText) < 1) {
    throw new InputError(at(1), `expected the number of centres (an integer ≥ 1) on the first line (XYZ format), got ${JSON.stringify(countText)}`);
  }
  const count = Number(countText);
  if (options.maxCentres && count > options.maxCentres.count) {
    throw new InputError(at(1), `announces ${count} centres; at most ${options.maxCentres.count} can be handled: ${options.maxCentres.why}`);
  }
  if (lines.length < 2) throw new InputError(at(2), 'the comment line is missing (XYZ: count line, comment line, then one "label x y z" line per centre)');
  const comment = lines[1].trim();

  const centres: GeometryCentre[] = [];
  for (let k = 0; k < count; k++) {
    const line = k + 3;
    const raw = lines[line - 1];
    if (raw === undefined || raw.trim() === '') {
      const atEnd = lines.slice(line - 1).every((l) => l.trim() === '');
      throw new InputError(at(line), `expected centre ${k + 1} of ${count} ("label x y z"), found ${atEnd ? 'the end of the file' : 'an empty line'}`);
    }
    const fields = raw.trim().split(/\s+/);
    if (fields.length !== 4 && fields.length !== 5) {
      throw new InputError(at(line), `expected "label x y z" (4 fields), got ${fields.length}: ${JSON.stringify(raw.trim())} (a fifth column, as extended XYZ files have, is allowed and ignored)`);
    }
    const [label, ...xyz] = fields.slice(0, 4);
    if (NUMBER.test(label)) throw new InputError(at(line), `expected a label first, got the number ${JSON.stringify(label)}`);
    const position = xyz.map((f, axis) => {
      if (!NUMBER.test(f)) throw new InputError(at(line), `${'xyz'[axis]} coordinate ${JSON.stringify(f)} is not a number`);
      const x = Number(f.replace(/[dD]/, 'e'));
      if (!Number.isFinite(x)) throw new InputError(at(line), `${'xyz'[axis]} coordinate ${JSON.stringify(f)} is not finite`);
      return toBohr(x);
    }) as Vec3;
    centres.push({ label, position, line });
  }
  for (let line = count + 3; line <= lines.length; line++) {
    if (lines[line - 1].trim() !== '') {
      throw new InputError(at(line), `unexpected content after the ${count} centres announced on line 1: ${JSON.stringify(lines[line - 1].trim())}`);
    }
  }
  requireApart(centres, options.minSeparation ?? 1e-3, at);
  return { comment, centres };
}

/**
 * Refuse centres closer than `minSep` (bohr), in O(N): each centre goes into a cubic grid cell of side minSep,
 * and only the 27 cells around it can hold a centre that close (a spatial hash; common practice).
 */
function requireApart(centres: readonly GeometryCentre[], minSep: number, at: (line: number) => string): void {
  // cell (i, j, k) → a small integer, each index folded to 10 bits: distant cells may share a key, which only costs a
  // distance test; number keys keep the scan about ten times faster than string keys
  const WRAP = 1024;
  const fold = (x: number) => ((x % WRAP) + WRAP) % WRAP;
  const key = (i: number, j: number, k: number) => (fold(i) * WRAP + fold(j)) * WRAP + fold(k);
  const cells = new Map<number, GeometryCentre[]>();
  for (const c of centres) {
    const [i, j, k] = c.position.map((x) => Math.floor(x / minSep));
    for (let di = -1; di <= 1; di++)
      for (let dj = -1; dj <= 1; dj++)
        for (let dk = -1; dk <= 1; dk++) {
          const near = cells.get(key(i + di, j + dj, k + dk));
          if (!near) continue;
          for (const other of near) {
            const r = distance(c.position, other.position);
            if (r < minSep) {
              throw new InputError(at(c.line), `centre ${c.label} coincides with centre ${other.label} on line ${other.line} (${r.toExponential(2)} bohr apart)`);
            }
          }
        }
    const own = key(i, j, k);
    const list = cells.get(own);
    if (list) list.push(c);
    else cells.set(own, [c]);
  }
}

/** |a − b|, bohr. */
export function distance(a: Vec3, b: Vec3): number {
  return Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);
}
