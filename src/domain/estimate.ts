/**
 * Sales + subject + model → the whole Result JSON (DESIGN.md "Statistics"): which sales are
 * used, the standardized fit in unit terms, the subject's value and intervals, diagnostics,
 * leave-one-out ratio study, warnings and the adjustment grid. Pure: no I/O, no clock.
 */
import { conditionDiagnosticsOfFactor, type ConditionDiagnostics } from '../stats/condition-indices.js';
import { influenceMeasures } from '../stats/influence.js';
import { pointIntervals } from '../stats/intervals.js';
import { pressStatistics } from '../stats/press.js';
import { ratioStudy } from '../stats/ratio-study.js';
import { breuschPaganKoenker, jarqueBera } from '../stats/residual-tests.js';
import { standardizedFit, type StandardizedFit, type Term } from '../stats/standardized-fit.js';
import { varianceInflationFactors } from '../stats/vif.js';
import { adjustmentGrid } from './adjustment-grid.js';
import type { EstimateResult, ModelFitSummary, SaleDiagnostics, SaleFlag } from './estimate-result.js';
import { modelWarnings, sortWarnings, subjectWarnings } from './estimate-warnings.js';
import { PREDICTOR_SOURCE, saleValue, subjectValue, type ModelSpec } from './model.js';
import type { Sale, Subject } from './sale.js';

/** A model that cannot give a number: each problem says what is wrong and what to do. */
export class EstimateError extends Error {
  constructor(public readonly problems: string[]) {
    super(problems.join('\n'));
    this.name = 'EstimateError';
  }
}

/**
 * Splits sales into used and left out (with the reason), per DESIGN.md "Sales used", and
 * reads each predictor of the sales used into a column.
 */
export function selectSales(
  sales: readonly Sale[],
  effectiveDate: string,
  model: ModelSpec,
): { used: Sale[]; columns: Float64Array[]; leftOut: { sale: Sale; reason: string }[] } {
  const k = model.predictors.length;
  const used: Sale[] = [];
  const leftOut: { sale: Sale; reason: string }[] = [];
  const columns = Array.from({ length: k }, () => new Float64Array(sales.length));
  for (const sale of sales) {
    if (!sale.included) {
      leftOut.push({ sale, reason: `excluded: ${sale.excludedReason ?? 'no reason given'}` });
      continue;
    }
    const row = used.length;
    let complete = true;
    for (let j = 0; j < k && complete; j++) {
      const v = saleValue(model.predictors[j], sale, effectiveDate);
      if (v === undefined) complete = false;
      else columns[j][row] = v;
    }
    if (complete) {
      used.push(sale);
      continue;
    }
    const missing = new Set<string>();
    for (const predictor of model.predictors)
      if (saleValue(predictor, sale, effectiveDate) === undefined) missing.add(PREDICTOR_SOURCE[predictor] ?? predictor);
    leftOut.push({ sale, reason: `missing ${[...missing].join(', ')}` });
  }
  return { used, columns: columns.map((c) => c.slice(0, used.length)), leftOut };
}

/**
 * A fitted model without a subject: what the fit summary shows. `effectiveDate` fixes
 * `months_since_sale` (and nothing else). Internals stay out of the JSON.
 */
export interface FittedModel {
  summary: ModelFitSummary;
  effectiveDate: string;
  /** Internals for estimateFor; not serialised. */
  internals: {
    fit: StandardizedFit;
    terms: Term[];
    prices: Float64Array;
    usedIds: string[];
    conditioning: ConditionDiagnostics;
    smearingFactor: number;
    maxLeverage: number;
  };
}

export function fitModel(sales: readonly Sale[], model: ModelSpec, effectiveDate: string): FittedModel {
  const { predictors, transform, level } = model;
  const k = predictors.length;
  const p = k + 1;
  const { used, columns, leftOut } = selectSales(sales, effectiveDate, model);
  const n = used.length;
  if (n <= p)
    throw new EstimateError([
      `only ${n} sale${n === 1 ? '' : 's'} can be used but the model has ${p} coefficients (intercept + ${predictors.join(', ')}); ` +
        `it needs at least ${p + 1} sales to leave any residual degrees of freedom: add sales or drop predictors` +
        (leftOut.length > 0 ? ` (${leftOut.length} left out, e.g. ${leftOut[0].sale.id}: ${leftOut[0].reason})` : ''),
    ]);

  const terms: Term[] = predictors.map((name, j) => ({
    name,
    values: columns[j],
    ...(name === 'living_area^2' ? { squareOf: predictors.indexOf('living_area') } : {}),
  }));
  const constant = terms.filter((t) => {
    for (let i = 1; i < n; i++) if (t.values[i] !== t.values[0]) return false;
    return true;
  });
  if (constant.length > 0)
    throw new EstimateError(
      constant.map((t) => `${t.name} has no variation among the ${n} sales used (every one is ${round(t.values[0])}): drop it from the model`),
    );
  const prices = new Float64Array(n);
  for (let i = 0; i < n; i++) prices[i] = used[i].salePrice;
  const y = transform === 'log' ? prices.map(Math.log) : prices;

  let fit: StandardizedFit;
  try {
    fit = standardizedFit(terms, y);
  } catch (err) {
    const m = /leastSquares: (.+) is an exact linear combination of (.+) \(collinear\)/.exec((err as Error).message);
    if (m)
      throw new EstimateError([
        `${m[1]} is an exact linear combination of ${m[2].replace('(intercept)', 'a constant')} among the sales used (perfectly collinear): drop one of them from the model`,
      ]);
    throw err;
  }
  const ls = fit.regression.ls;
  const sigma = ls.sigma;
  const smearingFactor = transform === 'log' ? ls.residuals.reduce((s, e) => s + Math.exp(e), 0) / n : 1;
  const back = (v: number) => (transform === 'log' ? Math.exp(v) : v);
  const maxLeverage = ls.hatValues.reduce((a, b) => Math.max(a, b), 0);

  const vif = varianceInflationFactors(fit.rawUnscaledCovariance, [null, ...fit.sds.map((sd) => (n - 1) * sd * sd)]);
  const conditioning = conditionDiagnosticsOfFactor(fit.rawDesignFactor);
  const influence = influenceMeasures(ls.residuals, ls.hatValues, sigma, p);
  const press = pressStatistics(ls.residuals, ls.hatValues, fit.regression.tss);

  // Leave-one-out predictions ŷ₍ᵢ₎ = yᵢ − e₍ᵢ₎ (exp for log), then the ratio study on them.
  const looPrediction = new Float64Array(n);
  const looIdx: number[] = [];
  for (let i = 0; i < n; i++) {
    const e = press.pressResiduals[i];
    looPrediction[i] = Number.isNaN(e) ? NaN : back(y[i] - e);
    if (!Number.isNaN(e)) looIdx.push(i);
  }
  const ratios = ratioStudy(
    Float64Array.from(looIdx, (i) => looPrediction[i]),
    Float64Array.from(looIdx, (i) => prices[i]),
  );
  const leverageCut = (2 * p) / n;
  const cooksCut = 4 / n;
  const saleRows: SaleDiagnostics[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const h = ls.hatValues[i];
    const t = influence.externallyStudentized[i];
    const d = influence.cooksDistance[i];
    // Most sales carry no flag: they share one empty list instead of allocating their own.
    let flags: SaleFlag[] = NO_FLAGS;
    if ((leverageCut < 1 && h > leverageCut) || Math.abs(t) > 3 || d > cooksCut) {
      flags = [];
      if (leverageCut < 1 && h > leverageCut) flags.push('high-leverage');
      if (Math.abs(t) > 3) flags.push('outlier');
      if (d > cooksCut) flags.push('influential');
      if (d > 1) flags.push('very-influential');
    }
    saleRows[i] = {
      id: used[i].id,
      used: true,
      excludedReason: null,
      fitted: back(ls.fitted[i]),
      residual: ls.residuals[i],
      leverage: h,
      studentized: finiteOrNull(t),
      standardizedResidual: finiteOrNull(influence.studentized[i]),
      cooksDistance: finiteOrNull(d),
      dffits: finiteOrNull(influence.dffits[i]),
      looPrediction: finiteOrNull(looPrediction[i]),
      flags,
    };
  }
  for (const l of leftOut)
    saleRows.push({
      id: l.sale.id,
      used: false,
      excludedReason: l.reason,
      fitted: null,
      residual: null,
      leverage: null,
      studentized: null,
      standardizedResidual: null,
      cooksDistance: null,
      dffits: null,
      looPrediction: null,
      flags: [],
    });

  const coefficients = fit.coefficients.map((c, j) => ({
    term: c.term as EstimateResult['coefficients'][number]['term'],
    estimate: c.estimate,
    stdError: c.stdError,
    t: c.t,
    p: c.p,
    standardized: c.standardized,
    vif: vif[j],
  }));

  const ranges: ModelFitSummary['ranges'] = {};
  predictors.forEach((name, j) => {
    const v = terms[j].values;
    let min = v[0];
    let max = v[0];
    for (let i = 1; i < n; i++) {
      if (v[i] < min) min = v[i];
      else if (v[i] > max) max = v[i];
    }
    ranges[name] = { min, max };
  });

  const summary: ModelFitSummary = {
    n,
    predictors: [...predictors],
    transform,
    level,
    coefficients,
    fit: {
      rSquared: fit.regression.rSquared,
      adjRSquared: fit.regression.adjRSquared,
      sigma,
      fStatistic: fit.regression.fStatistic,
      fPValue: fit.regression.fPValue,
      dfResidual: ls.dfResidual,
      conditionNumber: conditioning.conditionNumber,
      conditionIndices: conditioning.indices,
    },
    warnings: [],
    sales: saleRows,
    validation: {
      press: press.press,
      predictedRSquared: press.predictedRSquared,
      medianRatio: ratios.medianRatio,
      meanRatio: ratios.meanRatio,
      weightedMeanRatio: ratios.weightedMeanRatio,
      cod: ratios.cod,
      prd: ratios.prd,
      prb: ratios.prb,
      count: ratios.count,
    },
    residualTests: { breuschPagan: breuschPaganKoenker(ls), jarqueBera: jarqueBera(ls.residuals) },
    ranges,
  };
  let first = used[0].saleDate;
  let last = first;
  for (const u of used) {
    if (u.saleDate < first) first = u.saleDate;
    else if (u.saleDate > last) last = u.saleDate;
  }
  summary.warnings = modelWarnings(summary, conditioning, { first, last });
  return {
    summary,
    effectiveDate,
    internals: { fit, terms, prices, usedIds: used.map((u) => u.id), conditioning, smearingFactor, maxLeverage },
  };
}

/** The subject's estimate from a fitted model: value, intervals, range checks, grid, warnings. */
export function estimateFor(fitted: FittedModel, subject: Subject): EstimateResult {
  const { summary, internals } = fitted;
  const { predictors, transform, level } = summary;
  if (subject.effectiveDate !== fitted.effectiveDate && predictors.includes('months_since_sale'))
    throw new RangeError('estimateFor: the model was fitted for another effective date');
  const subjectValues: number[] = [];
  const problems: string[] = [];
  for (const predictor of predictors) {
    const v = subjectValue(predictor, subject);
    if (v === undefined) problems.push(`the subject has no ${PREDICTOR_SOURCE[predictor]}, which ${predictor} needs: enter it or drop ${predictor} from the model`);
    else subjectValues.push(v);
  }
  if (problems.length > 0) throw new EstimateError(problems);

  const { fit, smearingFactor, maxLeverage } = internals;
  const back = (v: number) => (transform === 'log' ? Math.exp(v) : v);
  // Subject: ŷ₀, h₀ and both intervals on the model's scale, then back to price units.
  const at = fit.predictAt(subjectValues);
  const iv = pointIntervals(at.fit, summary.fit.sigma, at.leverage, summary.fit.dfResidual, level);
  const grid = adjustmentGrid(
    predictors,
    summary.coefficients.slice(1).map((c) => c.estimate),
    subjectValues,
    internals.usedIds,
    internals.prices,
    internals.terms.map((t) => t.values),
    transform,
  );
  const ranges: EstimateResult['ranges'] = {};
  predictors.forEach((name, j) => (ranges[name] = { ...summary.ranges[name], subject: subjectValues[j] }));
  const result: EstimateResult = {
    ...summary,
    estimate: {
      value: back(at.fit) * smearingFactor,
      fit: at.fit,
      fitStdError: iv.fitStdError,
      predictionStdError: iv.predictionStdError,
      leverage: at.leverage,
      maxLeverage,
      confidence: [back(iv.confidence[0]), back(iv.confidence[1])],
      prediction: [back(iv.prediction[0]), back(iv.prediction[1])],
      median: back(at.fit),
      smearingFactor,
      predictorValues: Object.fromEntries(predictors.map((name, j) => [name, subjectValues[j]])),
    },
    ranges,
    grid,
  };
  result.warnings = sortWarnings([...subjectWarnings(result), ...summary.warnings]);
  return result;
}

/** Sales + subject + model → the whole Result JSON. */
export function runEstimate(sales: readonly Sale[], subject: Subject, model: ModelSpec): EstimateResult {
  for (const predictor of model.predictors)
    if (subjectValue(predictor, subject) === undefined)
      throw new EstimateError([`the subject has no ${PREDICTOR_SOURCE[predictor]}, which ${predictor} needs: enter it or drop ${predictor} from the model`]);
  return estimateFor(fitModel(sales, model, subject.effectiveDate), subject);
}

const NO_FLAGS: SaleFlag[] = Object.freeze([]) as unknown as SaleFlag[];

function finiteOrNull(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}

function round(x: number): string {
  return Number.isInteger(x) ? String(x) : x.toFixed(2);
}
