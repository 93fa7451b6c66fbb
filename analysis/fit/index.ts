/** Public API of the fitting engine. */
export { fitModel } from './fit-model';
export { predictAt } from './predict-at';
export { compileModel, type CompiledModel } from './model-expression';
export { BUILTIN_MODELS, type BuiltinModel } from './builtin-models';
export { levenbergMarquardt, type LeastSquaresProblem, type LmOptions, type LmResult } from './levenberg-marquardt';
export { linearLeastSquares, polynomialDesign, type LinearLeastSquaresResult } from './linear-least-squares';
export { groupReplicates } from './replicates';
export { lackOfFit } from './lack-of-fit';
export { informationCriteria } from './information-criteria';
export type * from './types';
export { compareModels, type CompareInput, type CompareModel, type ComparedModel, type ModelComparison } from './compare-models';
export { runsTest, type RunsTestResult } from './runs-test';
export { bootstrapDerived, bootstrapParameters, percentileSummary, type BootstrapResult } from './bootstrap-derived';
export { heatOptimum, type HeatOptimum } from './heat-optimum';
export { fittedCurve, type FittedCurve } from './fitted-curve';
