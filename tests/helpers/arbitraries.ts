/** fast-check generators shared by the property tests. */
import fc from 'fast-check';

/**
 * Parameters of two isotropic QDOs (qa, ma, wa, qb, mb, wb, atomic units) in a well-conditioned range, and a
 * scale factor s for scaling identities.
 */
export const qdoPairWithScale = fc.record({
  qa: fc.double({ min: 0.5, max: 2, noNaN: true }),
  ma: fc.double({ min: 0.3, max: 2, noNaN: true }),
  wa: fc.double({ min: 0.3, max: 1.5, noNaN: true }),
  qb: fc.double({ min: 0.5, max: 2, noNaN: true }),
  mb: fc.double({ min: 0.3, max: 2, noNaN: true }),
  wb: fc.double({ min: 0.3, max: 1.5, noNaN: true }),
  s: fc.double({ min: 0.5, max: 3, noNaN: true }),
});
