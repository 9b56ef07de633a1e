/** The "response" route: quadrature over imaginary frequency of each species' response functions. */
import type { Route, RouteResult } from '../route.js';
import { d7 } from '../route.js';
import { isotropicResponseOf, responsePowerLimit, speciesNotes, tensorResponseOf } from '../capabilities.js';
import { isotropicResponseCoefficients } from './isotropic-kernel.js';
import { tensorResponseCoefficients, type ResponseCoefficients } from './tensor-kernel.js';

export const responseRoute: Route = {
  name: 'response',
  summary: 'Casimir–Polder-type quadrature of response functions at imaginary frequency',
  unsupported(A, B) {
    if (isotropicResponseOf(A) && isotropicResponseOf(B)) return null;
    if (tensorResponseOf(A) && tensorResponseOf(B)) return null;
    return `no common response form for ${A.name} and ${B.name} (one is anisotropic and the other has only scalar response functions)`;
  },
  run(A, B, options): RouteResult {
    const isoA = isotropicResponseOf(A), isoB = isotropicResponseOf(B);
    let r: ResponseCoefficients;
    if (isoA && isoB) r = isotropicResponseCoefficients(isoA, isoB, { relTol: options.relTol, maxEnergyPower: options.maxEnergyPower });
    else {
      const tA = tensorResponseOf(A), tB = tensorResponseOf(B);
      if (!tA || !tB) throw new Error(this.unsupported(A, B) ?? 'response route unavailable');
      r = tensorResponseCoefficients(tA, tB, { relTol: options.relTol, maxEnergyPower: options.maxEnergyPower });
    }
    // species whose data stop at alpha_1 (or alpha_2) give no C8 (C10)
    const power = Math.min(options.maxEnergyPower ?? 10, responsePowerLimit(A), responsePowerLimit(B));
    const { E5, D4a, D4b } = r.permanent;
    return {
      name: 'response',
      C6: r.C6,
      ...(power >= 8 ? { C8: r.C8 } : {}),
      ...(power >= 10 ? { C10: r.C10 } : {}),
      D7: d7(r.D7a, r.D7b),
      // error estimates of exactly the coefficients reported
      error: {
        C6: r.error.C6,
        ...(power >= 8 ? { C8: r.error.C8 } : {}),
        ...(power >= 10 ? { C10: r.error.C10 } : {}),
        D7a: r.error.D7a,
        D7b: r.error.D7b,
      },
      ...(E5 !== 0 || D4a !== 0 || D4b !== 0 ? { permanent: { E5, D4: d7(D4a, D4b) } } : {}),
      converged: r.converged,
      notes: [`${r.kernel} kernel, ${r.evaluations} frequency points`, ...new Set([...speciesNotes(A), ...speciesNotes(B)])],
    };
  },
};
