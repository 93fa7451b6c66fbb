/** Plain-data types of the fitting engine (all JSON-serialisable: no NaN, no Infinity, null instead). */

/** What to fit. SI units inside: for the heater built-ins x is volume flow in m³/s, temperatures in °C. */
export interface FitInput {
  /** predictor per point (built-in heater models: volume flow, m³/s) */
  x: number[];
  /** response per point (built-in heater models: outlet temperature, °C) */
  y: number[];
  /** a built-in name (`coil`, `exp-approach`, `exp-inlet`, `poly1`–`poly3`, `power`) or a mathjs expression in x */
  model: string;
  /** starting values by parameter name; for an expression they also declare which symbols are parameters */
  start?: Record<string, number>;
  /** weights per point, 1/u² with u the standard uncertainty of y (unit of y⁻²) */
  weights?: number[];
  /** bounds by parameter name, [low, high]; null or ±Infinity for no bound on that side */
  bounds?: Record<string, [number | null, number | null]>;
  /** per-point covariates by name (built-ins: Tin °C, rho kg/m³, cp J/(kg·K)) */
  covariates?: Record<string, number[]>;
  /** how close x values must be to count as replicates (default relative 0.02, absolute 0) */
  replicateTolerance?: ReplicateTolerance;
  /** grid for the confidence and prediction bands (default: 41 points over the data range) */
  grid?: { from?: number; to?: number; points?: number };
  /** confidence level for intervals and bands (default 0.95) */
  level?: number;
}

/** When two x values count as the same setting (replicates). */
export interface ReplicateTolerance {
  /** x values within this fraction of their magnitude agree (default 0.02) */
  relative?: number;
  /** x values within this absolute distance agree (unit of x; default 0) */
  absolute?: number;
}

/** Why a fit could not be done. */
export type FitFailureCode =
  | 'invalid-input'
  | 'invalid-expression'
  | 'too-few-points'
  | 'degenerate-x'
  | 'singular'
  | 'no-convergence'
  | 'bad-start'
  | 'out-of-range';

/** A fit that cannot be done: the code for programs, the reason in plain words for people. */
export interface FitFailure {
  ok: false;
  code: FitFailureCode;
  reason: string;
}

/** One fitted parameter (units of the parameter, e.g. W/K for UA). */
export interface ParameterEstimate {
  value: number;
  stdErr: number;
  /** t-based confidence interval at the fit's level */
  ciLow: number;
  ciHigh: number;
  /** value / stdErr (null when stdErr is 0) */
  tValue: number | null;
  /** two-sided p-value of the t test that the parameter is 0 (null when stdErr is 0) */
  pValue: number | null;
  /** which bound, if any, the estimate sits on */
  atBound: 'lower' | 'upper' | null;
}

/** Something a reviewer should look at; the fit itself succeeded. */
export interface FitWarning {
  code: 'at-bound' | 'high-correlation' | 'ill-conditioned' | 'extrapolation' | 'exact-fit' | 'default-property' | 'unphysical' | 'auto-start' | 'numeric-jacobian' | 'not-identifiable';
  /** starts with `not identifiable: <parameter>` for that code */
  message: string;
  /** the parameter a `not-identifiable` warning is about */
  parameter?: string;
}

/** A prediction with its confidence (mean) and prediction (new observation) intervals, units of y. */
export interface BandPoint {
  x: number;
  y: number;
  /** standard error of the fitted mean at x */
  seMean: number;
  ciLow: number;
  ciHigh: number;
  /** prediction interval for one new observation */
  piLow: number;
  piHigh: number;
  /** x lies outside the range of the fitted data */
  extrapolated: boolean;
}

/** Points at one x setting (see groupReplicates). */
export interface ReplicateGroup {
  /** indices of the points in the group */
  indices: number[];
  n: number;
  xMean: number;
  yMean: number;
  /** sample standard deviation of y (null when n = 1) */
  ySD: number | null;
}

/** Pure-error lack-of-fit F test (see lackOfFit). */
export interface LackOfFitResult {
  ok: true;
  /** number of distinct x groups */
  groups: number;
  pureErrorSS: number;
  pureErrorDf: number;
  lackOfFitSS: number;
  lackOfFitDf: number;
  F: number;
  pValue: number;
  /** plain-words reading at the 5 % level */
  verdict: string;
}

/** What a fit needs to be re-evaluated (predictions, bootstrap). */
export interface FitSpec {
  model: string;
  expression: string;
  parameterNames: string[];
  covariateNames: string[];
  x: number[];
  y: number[];
  weights: number[] | null;
  covariates: Record<string, number[]>;
  /** bounds by parameter, null for none on that side */
  bounds: Record<string, [number | null, number | null]>;
  /** mean of each covariate, used when a prediction is asked for without covariates */
  covariateMeans: Record<string, number>;
  /** variance of one new observation relative to s² (1 unweighted; mean 1/w weighted) */
  predictionVarianceFactor: number;
}

/** Everything a successful fit reports (JSON-serialisable; no NaN or Infinity). */
export interface FitSuccess {
  ok: true;
  model: string;
  expression: string;
  /** linear models are solved exactly by QR; nonlinear ones by Levenberg–Marquardt */
  method: 'linear-qr' | 'levenberg-marquardt';
  parameterNames: string[];
  params: Record<string, ParameterEstimate>;
  /** covariance matrix of the parameters, in parameterNames order */
  covariance: number[][];
  correlation: number[][];
  n: number;
  p: number;
  df: number;
  /** weighted residual sum of squares Σ w (y − ŷ)² */
  rss: number;
  /** √(rss/df) */
  residualSD: number;
  /** weighted, about the weighted mean (null when all y are equal) */
  r2: number | null;
  adjustedR2: number | null;
  /** √(rss/n) */
  rmse: number;
  /** Gaussian log-likelihood with the variance estimated; AIC/AICc/BIC count p + 1 parameters (null for an exact fit) */
  logLikelihood: number | null;
  aic: number | null;
  aicc: number | null;
  bic: number | null;
  level: number;
  tQuantile: number;
  fitted: number[];
  /** y − ŷ */
  residuals: number[];
  /** internally studentized: √w·e / (s √(1 − h)) */
  standardizedResiduals: (number | null)[];
  /** externally studentized (leave-one-out variance) */
  studentizedResiduals: (number | null)[];
  leverage: number[];
  cooksDistance: (number | null)[];
  /** DFFITS = studentized residual · √(h/(1 − h)) (Belsley, Kuh & Welsch 1980); |DFFITS| > 2√(p/n) is influential */
  dffits: (number | null)[];
  flags: { highLeverage: number[]; influential: number[]; outliers: number[] };
  band: BandPoint[];
  iterations: number;
  evaluations: number;
  converged: boolean;
  stoppingReason: string;
  /** 2-norm condition number of the column-scaled weighted Jacobian */
  conditionNumber: number;
  jacobian: 'analytic' | 'numeric' | 'mixed' | 'linear';
  xRange: [number, number];
  replicates: ReplicateGroup[];
  /** pure-error lack-of-fit F test; null when there are no replicates */
  lackOfFit: LackOfFitResult | { ok: false; reason: string } | null;
  warnings: FitWarning[];
  spec: FitSpec;
}

/** What fitModel returns. */
export type FitResult = FitSuccess | FitFailure;
