/**
 * The physical accuracy of a pair's numbers in words (src/engines/accuracy.ts), kept apart from the numerical
 * cross-check of the routes: route agreement says the arithmetic is right, this says how good the model is.
 */
import type { PairAccuracy } from '../engines/accuracy.js';
import type { PairResult } from '../engines/pair.js';
import { sig, spreadText } from './format.js';

/** The `accuracy` object of `dispole pair --json` and of table rows (levels per species, statement, uncertainty). */
export function accuracyToJson(a: PairAccuracy): Record<string, unknown> {
  return {
    level: a.level,
    quantities: a.quantities,
    statement: a.statement,
    ...(a.uncertainty ? { uncertainty: a.uncertainty } : {}),
  };
}

/** The line about the routes: a numerical cross-check, never a statement about accuracy. */
export function crossCheckLine(p: PairResult): string {
  if (!p.trusted) return 'UNTRUSTED: see the warnings below.';
  if (p.routes.length > 1) {
    return `All routes agree (numerical cross-check, largest relative spread ${spreadText(p.spread.max)}): the arithmetic is checked, not the model.`;
  }
  return `Only the ${p.routes[0].name} route could run: no cross-check.`;
}

/** The "Model accuracy" line: levels per species and the statement (pair, curve and density reports). */
export function accuracyStatementLine(a: PairAccuracy, nameA: string, nameB: string): string {
  return `Model accuracy (physical; levels ${nameA}: ${a.level.a}, ${nameB}: ${a.level.b}): ${a.statement}`;
}

/** "Model accuracy" lines of the text report: the statement and the D7 uncertainty with the models it spans (the rescaling factors are in the route notes). */
export function accuracyLines(p: PairResult, digits = 3): string[] {
  const a = p.accuracy;
  const lines = [accuracyStatementLine(a, p.a.name, p.b.name)];
  if (a.uncertainty) {
    const u = a.uncertainty.D7, d = p.coefficients.D7;
    const pm = (x: number, e: number) => `${sig(x, digits)} ± ${sig(e, 2)}`;
    lines.push(`  D7 estimate: D7.a = ${pm(d.a, u.a)}, D7.b = ${pm(d.b, u.b)}, D7.total = ${pm(d.total, u.total)} e a0^8 (${a.uncertainty.method})`);
    for (const m of a.uncertainty.models) lines.push(`    ${m.model}: D7.a = ${sig(m.D7.a, digits)}, D7.b = ${sig(m.D7.b, digits)}, D7.total = ${sig(m.D7.total, digits)}`);
  }
  return lines;
}
