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
// real atoms: hydrogen from first principles, the sourced atom library, user response data
export { chargeWarning, pairSpeciesWarnings, hasLocalSpace, speciesNotes, speciesWarnings, responsePowerLimit } from './engines/capabilities.js';
export { hydrogenic, DEFAULT_HYDROGENIC_BASIS, type HydrogenicSpecies } from './model/hydrogenic.js';
export {
  parseResponseData, oscillatorSpectrum, responseDataFromText, responseDataSpeciesFile, isResponseDataFile,
  type ResponseTableSpecies, type OscillatorSpectrumSpecies, type ResponseDataSpecies,
} from './model/response-data.js';
export { ATOM_LIBRARY, HYDROGEN_EXACT, type AtomRecord, type SourcedValue } from './data/atom-library.js';
export { atomLibrarySpecies } from './model/builtin-species.js';
export { hydrogenicSpectrum, type RadialPseudoSpectrum } from './engines/atoms/sturmian-spectrum.js';
export { pseudoStateSpace } from './engines/atoms/pseudo-state-space.js';
export { pseudoStateResponse, type StaticAtomProperties } from './engines/atoms/pseudo-state-response.js';
export { hydrogenicSpace, hydrogenicResponse, hydrogenicBasisCheck, hydrogenicLikePair } from './engines/atoms/hydrogenic-atom.js';
export { responseTableResponse, oscillatorSpectrumResponse, type DataResponse } from './engines/atoms/tabulated-response.js';
export { finiteFieldGroundState } from './engines/atoms/finite-field.js';
export type { Route, RouteResult, RouteOptions, D7Triple } from './engines/route.js';
export { defaultRoutes, optionalRoutes, routeByName, routeNames } from './engines/routes.js';
export { computePair, routeSpread, type PairResult, type PairOptions, type Spread } from './engines/pair.js';
export {
  allPairs, selectPairs, computeTable, requireDistinctSpecies, rowStatus, untrustedCount,
  type CoefficientTable, type TableRow, type TableOptions, type TableSettings, type RowStatus, type SpeciesPair,
} from './engines/table.js';
// finite-R exact solution (route "exact", curves, densities)
export { exactSolver, type ExactOptions, type ExactPoint, type ExactState, type BasisStep } from './engines/exact/exact-solver.js';
export { exactModel, hamiltonianAt, axialProblem, MAX_EXACT_ORDER, type ExactModel } from './engines/exact/pair-hamiltonian.js';
export { pairBasis, fullProductDimension, type PairBasis } from './engines/exact/pair-basis.js';
export { solveInBasis, type BasisSolution } from './engines/exact/ground-state.js';
export { localisationCheck, catastropheDistance, type LocalisationCheck } from './engines/exact/localisation.js';
export { exactAsymptotics, asymptoticGrid, type ExactAsymptotics } from './engines/exact/exact-asymptotics.js';
export { exactCurve, separationGrid, type ExactCurve, type GridSpacing } from './engines/exact/curve.js';
export { densityChange, type DensityMap } from './engines/exact/density.js';
export { exactRoute } from './engines/exact/route.js';
// symbolic engine: closed forms for QDO pairs and checks of users' formulas (mathjs loads on the first check)
export {
  deriveQuantities, defaultQuantities, supportedQuantities, parseQuantityName, SYMBOLIC_QUANTITIES, DEFAULT_QUANTITIES,
  QUANTITY_MEANING, type SymbolicQuantity, type DerivedQuantity, type VariableSet,
} from './engines/symbolic/derive.js';
export { symbolTable, type PairLayout, type SymbolTable, type SymbolInfo } from './engines/symbolic/symbols.js';
export { closedFormsEqual, evaluateClosedForm, evaluateClosedFormNumber, type ClosedForm } from './engines/symbolic/closed-form.js';
export { checkFormula, type CheckRequest, type CheckResult } from './engines/symbolic/formula-check.js';

// force balance and N oscillators
export { forceBalanceCoefficients, coupledPairZeroPointShift, type ForceBalanceCoefficients } from './engines/force-balance/pair-force-balance.js';
export { forceBalanceRoute } from './engines/force-balance/route.js';
export {
  computeCluster, pairEnergy, freeAlpha, freeC6,
  type ClusterCentre, type ClusterOptions, type ClusterResult, type ClusterCentreResult, type ClusterStage,
} from './engines/cluster/cluster.js';
export { parseXyz, type Geometry, type GeometryCentre, type XyzOptions } from './model/geometry.js';
export { clusterToJson, clusterToCsv, clusterToText, type ClusterSource } from './report/cluster-report.js';
export { symmetricEigen } from './math/symmetric-eigen.js';
export type { VectorCoefficients } from './engines/route.js';

// an atom in front of a surface
export { parseSurfaceSpec, parseEpsTable, constantSurface, describeSurface, type SurfaceSpec, type LorentzTerm } from './model/surface-spec.js';
export { computeSurface, surfaceRoutes, surfaceNormal, type SurfaceResult, type SurfaceOptions, type SurfaceSpread } from './engines/surface/surface.js';
export type { SurfaceRoute, SurfaceRouteResult, SurfaceRouteOptions } from './engines/surface/surface-route.js';
export { imageFactor, type ImageFactor } from './engines/surface/image-factor.js';
export { imageTerms, imagePolynomial, type ImageTerm } from './engines/surface/image-hamiltonian.js';
export { surfaceExactCurve, type SurfaceExactCurve, type SurfaceExactPoint, type SurfaceExactOptions } from './engines/surface/exact-surface.js';
export { deriveSurfaceQuantities, SURFACE_QUANTITIES, type SurfaceQuantity } from './engines/symbolic/symbolic-surface.js';
export { surfaceToJson, surfaceToText, surfaceCoefficientsToSI } from './report/surface-report.js';

// collision-induced absorption
export { computeCia, DEFAULT_CIA_NUMERICS, CIA_DIPOLE_CONVENTION, type CiaInput, type CiaResult, type CiaTemperature, type CiaSpectrum, type CiaNumerics } from './engines/cia/cia.js';
export { buildPotential, type PotentialSpec, type PairPotential } from './engines/cia/potential.js';
export { buildDipole, type DipoleSpec, type DipoleFunction } from './engines/cia/dipole.js';
export { tangToenniesDamping } from './engines/cia/damping.js';
export { HFD_SETS, type HfdParameters } from './engines/cia/hfd-parameters.js';
export { STANDARD_ATOMIC_WEIGHTS, standardAtomicWeight } from './engines/cia/masses.js';
export { absorptionPerAmagat2, alpha1FromM1, gamma1FromM0, BAND_INTEGRAL_DEFINITIONS } from './engines/cia/absorption.js';
export { parsePotentialArgument, parseDipoleArgument, parseTwoColumnTable } from './model/cia-spec.js';
export { ciaToJson, ciaToText, ciaToCsv } from './report/cia-report.js';
export { ciaFigure } from './report/svg/cia-figure.js';

// report
export { pairToJson, pairToText, coefficientsToSI } from './report/pair-report.js';
export { renderTable, TABLE_FORMATS, tableToJson, type TableFormat } from './report/table/index.js';
export { curveData, curveToText, curveToCsv, curveToJson, type CurveData } from './report/curve-report.js';
export { curveFigure } from './report/svg/curve-figure.js';
export { densityFigure, type DensityFigureSpec } from './report/svg/density-figure.js';
export { derivedToText, derivedToJson, checkToText, checkToJson } from './report/symbolic-report.js';

// cli (in-process runner, for embedding and tests)
export { runCli, EXIT } from './cli/program.js';
export { memoryIO, type CliIO } from './cli/io.js';
