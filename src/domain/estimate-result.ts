/**
 * The Result JSON of DESIGN.md "Interfaces": what `compfit estimate --format json`
 * prints, what the JSON API returns and what a saved estimate freezes.
 */

import type { RatioStudy } from '../stats/ratio-study.js';

export type Transform = 'none' | 'log';

/** Predictor names a model may use: characteristics, derived terms and the squared area. */
export const PREDICTORS = [
  'living_area',
  'age',
  'rooms',
  'bedrooms',
  'bathrooms',
  'lot_area',
  'garage_spaces',
  'months_since_sale',
  'living_area^2',
] as const;
export type Predictor = (typeof PREDICTORS)[number];

export const DEFAULT_PREDICTORS: Predictor[] = ['living_area', 'age', 'rooms'];

export function isPredictor(name: string): name is Predictor {
  return (PREDICTORS as readonly string[]).includes(name);
}

export interface CoefficientRow {
  term: '(intercept)' | Predictor;
  estimate: number;
  stdError: number;
  t: number;
  p: number;
  /** beta = b·s_x / s_y; null for the intercept. */
  standardized: number | null;
  /** null for the intercept. */
  vif: number | null;
}

export interface FitSummary {
  rSquared: number;
  adjRSquared: number;
  sigma: number;
  fStatistic: number;
  fPValue: number;
  dfResidual: number;
  conditionNumber: number;
  conditionIndices: number[];
}

export interface SubjectEstimate {
  /** Value in price units (for `log`: exp(fit) × smearing factor). */
  value: number;
  /** Fitted value on the model's own scale (ln price for `log`). */
  fit: number;
  fitStdError: number;
  predictionStdError: number;
  leverage: number;
  maxLeverage: number;
  confidence: [number, number];
  prediction: [number, number];
  /** exp(fit) for `log` (the median estimate); equals `value` for `none`. */
  median: number;
  /** Duan's smearing factor mean(exp(eᵢ)) for `log`; 1 for `none`. */
  smearingFactor: number;
  /** The subject's value of each predictor, as used in the fit. */
  predictorValues: Record<string, number>;
}

export type Severity = 'info' | 'caution' | 'serious';

export type WarningCode =
  | 'outside-range'
  | 'hidden-extrapolation'
  | 'collinearity'
  | 'small-sample'
  | 'outlier-sale'
  | 'influential-sale'
  | 'high-leverage-sale'
  | 'nonconstant-variance'
  | 'non-normal-residuals'
  | 'sales-left-out'
  | 'large-adjustment'
  /** Extension: sales spread over more than a year and no market-conditions term in the model. */
  | 'market-conditions';

export interface EstimateWarning {
  code: WarningCode;
  severity: Severity;
  message: string;
  /** Extra facts by code: predictor, subject value, range, sale ids, statistic, p … */
  [detail: string]: unknown;
}

export type SaleFlag = 'high-leverage' | 'outlier' | 'influential' | 'very-influential';

export interface SaleDiagnostics {
  id: string;
  used: boolean;
  excludedReason: string | null;
  fitted: number | null;
  residual: number | null;
  leverage: number | null;
  studentized: number | null;
  /** Internally studentized residual rᵢ. */
  standardizedResidual: number | null;
  cooksDistance: number | null;
  dffits: number | null;
  /** Leave-one-out prediction in price units (null when hᵢᵢ = 1). */
  looPrediction: number | null;
  flags: SaleFlag[];
}

/** PRESS and the leave-one-out ratio study; `count` is the sales in it (those with hᵢᵢ < 1). */
export interface Validation extends RatioStudy {
  press: number;
  predictedRSquared: number;
}

export interface ResidualTests {
  /** Koenker's studentized Breusch–Pagan: n·R² of e² on the predictors, χ²(k). */
  breuschPagan: { statistic: number; df: number; p: number };
  jarqueBera: { statistic: number; p: number; skewness: number; kurtosis: number };
}

export interface GridRow {
  id: string;
  salePrice: number;
  adjustments: Record<string, number>;
  adjustedPrice: number;
  netPercent: number;
  grossPercent: number;
}

export interface EstimateResult {
  n: number;
  predictors: Predictor[];
  transform: Transform;
  level: number;
  coefficients: CoefficientRow[];
  fit: FitSummary;
  estimate: SubjectEstimate;
  warnings: EstimateWarning[];
  sales: SaleDiagnostics[];
  validation: Validation;
  residualTests: ResidualTests;
  /** Per predictor: smallest and largest value among the sales used. */
  ranges: Record<string, { min: number; max: number; subject: number }>;
  grid: GridRow[];
}

/** The fit summary without a subject: everything of the Result but estimate and grid. */
export type ModelFitSummary = Omit<EstimateResult, 'estimate' | 'grid' | 'ranges'> & {
  ranges: Record<string, { min: number; max: number }>;
};
