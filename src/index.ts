/**
 * dispole — public library API. Atomic units throughout (see src/model/units.ts for conversions).
 * This file only re-exports; each area keeps its own modules.
 */

// model
export * from './model/units.js';
export * from './model/errors.js';
export type { Vec3, Estimate } from './model/types.js';
export * from './model/drude.js';
export { describeSpecies, type Species } from './model/species.js';
export { buildSpecies, parseInlineSpecies, speciesKinds, type SpeciesKind } from './model/species-kinds.js';
export { parseSpeciesFile } from './model/species-file.js';
export { builtinSpecies, demoSpecies, resolveSpecies, registerBuiltinCollection } from './model/builtin-species.js';

// hamiltonian
export * from './hamiltonian/monomial.js';
export { inverseDistanceTaylor } from './hamiltonian/inverse-distance-taylor.js';
export { couplingTerms, evaluateCoupling, type CouplingTerm } from './hamiltonian/multipole-coupling.js';
export * from './hamiltonian/drude-polynomial.js';

// math
export { gaussLegendre } from './math/gauss-legendre.js';
export { integrateSemiInfinite, type QuadratureOptions, type QuadratureResult } from './math/semi-infinite-quadrature.js';

// engines
export type { LocalSpace, LocalEntries } from './engines/perturbation/local-space.js';
export { harmonicSpace } from './engines/perturbation/harmonic-space.js';
export { perturbationCoefficients, requiredQuanta, type PerturbationCoefficients } from './engines/perturbation/rspt.js';
export type { IsotropicResponse, TensorResponse } from './engines/response/response-model.js';
export { drudeIsotropicResponse, drudeTensorResponse } from './engines/response/drude-response.js';
export { isotropicResponseCoefficients } from './engines/response/isotropic-kernel.js';
export { tensorResponseCoefficients, type ResponseCoefficients } from './engines/response/tensor-kernel.js';
export { localSpaceOf, isotropicResponseOf, tensorResponseOf, isSpherical } from './engines/capabilities.js';
export type { Route, RouteResult, RouteOptions, D7Triple } from './engines/route.js';
export { defaultRoutes, optionalRoutes, routeByName, routeNames } from './engines/routes.js';
export { computePair, routeSpread, type PairResult, type PairOptions, type Spread } from './engines/pair.js';

// report
export { pairToJson, pairToText, coefficientsToSI } from './report/pair-report.js';

// cli (in-process runner, for embedding and tests)
export { runCli, EXIT } from './cli/program.js';
export { memoryIO, type CliIO } from './cli/io.js';
