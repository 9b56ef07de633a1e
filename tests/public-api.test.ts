/** The package's public entry point (src/index.ts) offers every engine and report a library user needs. */
import { expect, test } from 'vitest';
import * as api from '../src/index.js';

test('the public API exports the species constructors, every route, the pair, table and cluster computations', () => {
  for (const name of [
    'drude', 'drudeAnisotropic', 'drudeFromTargets', 'hydrogenic', 'parseSpeciesFile', 'resolveSpecies',
    'couplingTerms', 'perturbationCoefficients', 'isotropicResponseCoefficients', 'tensorResponseCoefficients',
    'forceBalanceCoefficients', 'exactSolver', 'deriveQuantities', 'checkFormula',
    'computePair', 'computeTable', 'computeCluster', 'parseXyz', 'exactCurve',
    'pairToJson', 'renderTable', 'clusterToJson', 'curveFigure', 'runCli',
  ]) {
    expect(typeof (api as Record<string, unknown>)[name], name).toBe('function');
  }
  expect(api.defaultRoutes.map((r) => r.name)).toEqual(['perturbation', 'response', 'force-balance']);
  expect(api.optionalRoutes.map((r) => r.name)).toEqual(['exact']);
});
