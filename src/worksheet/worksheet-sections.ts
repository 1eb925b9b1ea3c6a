/**
 * The sections of a worksheet in reading order: the estimate and its warnings first, then
 * what it rests on (subject, model, coefficients, fit, ratio study, pictures), then the
 * per-sale tables and the method.
 */
import { predictorLabel } from '../domain/estimate-charts.js';
import type { EstimateResult } from '../domain/estimate-result.js';
import { areaLabel } from '../domain/format.js';
import { perUnitLabel, subjectValue } from '../domain/model.js';
import { CHARACTERISTIC_RULES, CHARACTERISTICS } from '../domain/sale.js';
import type { SavedEstimate } from '../domain/saved-estimate.js';
import {
  fixedCell,
  integerCell,
  moneyRateCell,
  pValueCell,
  priceCell,
  quantityCell,
  significantCell,
  significantDecimals,
  textCell,
  type Cell,
} from './worksheet-cells.js';
import { methodParagraphs } from './worksheet-method.js';
import type { ChartView, Field, IntervalView, WorksheetSection, WorksheetTable } from './worksheet-model.js';
import { adjustmentGridTable, characteristicCell, diagnosticsTable, salesLeftOutTable, salesUsedTable } from './worksheet-sales-tables.js';

const field = (label: string, ...cells: Cell[]): Field => ({ label, cells });
const levelText = (r: EstimateResult) => `${+(r.level * 100).toFixed(2)} %`;

function estimateSection(saved: SavedEstimate, interval: IntervalView): WorksheetSection {
  const r = saved.result;
  const e = r.estimate;
  const cur = saved.market.currency;
  const logScale = r.transform === 'log';
  const pct = levelText(r);
  const fields: Field[] = [field('Value', priceCell(e.value, cur))];
  if (logScale)
    fields.push(field('Median (exp of the fit)', priceCell(e.median, cur)), field("Duan's smearing factor", fixedCell(e.smearingFactor, 4)));
  fields.push(
    field(`${pct} prediction interval (one sale of the subject)`, priceCell(e.prediction[0], cur), priceCell(e.prediction[1], cur)),
    field(`${pct} confidence interval (mean price of such properties)`, priceCell(e.confidence[0], cur), priceCell(e.confidence[1], cur)),
    logScale
      ? field('Standard error of prediction (log scale)', fixedCell(e.predictionStdError, 4))
      : field('Standard error of prediction', priceCell(e.predictionStdError, cur)),
    logScale ? field('Standard error of the fit (log scale)', fixedCell(e.fitStdError, 4)) : field('Standard error of the fit', priceCell(e.fitStdError, cur)),
    field('Subject leverage h0', fixedCell(e.leverage, 4)),
    field('Largest leverage among the sales used', fixedCell(e.maxLeverage, 4)),
    field('Sales used', integerCell(r.n)),
  );
  return {
    id: 'estimate',
    heading: 'Estimate',
    blocks: [
      { kind: 'fields', id: 'estimate', fields },
      { kind: 'interval', view: interval },
    ],
  };
}

function warningsSection(r: EstimateResult): WorksheetSection {
  const table: WorksheetTable = {
    id: 'warnings',
    heading: 'Warnings',
    columns: [
      { heading: 'Severity', align: 'left' },
      { heading: 'Code', align: 'left' },
      { heading: 'Warning', align: 'left', wrap: true },
    ],
    rows: r.warnings.map((w) => [textCell(w.severity), textCell(w.code), textCell(w.message)]),
    empty: 'No warnings: no check on the model, the sales or the subject raised a concern.',
  };
  return { id: 'warnings', heading: 'Warnings', blocks: [{ kind: 'table', table }] };
}

function subjectSection(saved: SavedEstimate): WorksheetSection {
  const { subject, result } = saved;
  const unit = areaLabel(saved.market.areaUnit);
  const fields: Field[] = [field('Address', textCell(subject.address)), field('Effective date', textCell(subject.effectiveDate))];
  for (const c of CHARACTERISTICS) {
    const x = subject.characteristics[c];
    if (x === undefined) continue;
    const rule = CHARACTERISTIC_RULES[c];
    fields.push(field(rule.label, rule.unit === 'area' ? quantityCell(x, unit) : characteristicCell(c, x)));
  }
  if (result.predictors.includes('age')) fields.push(field('Age at the effective date (years)', integerCell(subjectValue('age', subject))));
  return { id: 'subject', heading: 'Subject', blocks: [{ kind: 'fields', id: 'subject', fields }] };
}

function modelSection(saved: SavedEstimate): WorksheetSection {
  const r = saved.result;
  const unit = areaLabel(saved.market.areaUnit);
  const left = r.sales.filter((s) => !s.used).length;
  const fields: Field[] = [
    field('Response', textCell(r.transform === 'log' ? 'natural log of the sale price' : 'sale price')),
    field('Predictors', textCell(r.predictors.map((p) => predictorLabel(p, unit)).join('; '))),
    field('Transform', textCell(r.transform === 'log' ? 'log' : 'none')),
    field('Interval level', textCell(levelText(r))),
    field('Sales in the market when saved', integerCell(saved.sales.length)),
    field('Sales used (n)', integerCell(r.n)),
    field('Sales left out', integerCell(left)),
  ];
  return {
    id: 'model',
    heading: 'Model',
    blocks: [
      { kind: 'fields', id: 'model', fields },
      { kind: 'table', table: salesLeftOutTable(saved) },
    ],
  };
}

/** 100·(exp(b) − 1) % per unit: what a log-scale coefficient means for the price. */
function percentEffect(b: number): string {
  const pct = 100 * Math.expm1(b);
  const d = significantDecimals(pct, 3, 6);
  return `${Math.abs(pct).toFixed(d)} % ${pct < 0 ? 'less' : 'more'}`;
}

function coefficientsSection(saved: SavedEstimate): WorksheetSection {
  const r = saved.result;
  const cur = saved.market.currency;
  const unit = areaLabel(saved.market.areaUnit);
  const logScale = r.transform === 'log';
  const value = (x: number) => (logScale ? significantCell(x, 4) : moneyRateCell(x, cur));
  const table: WorksheetTable = {
    id: 'coefficients',
    heading: 'Coefficients',
    columns: [
      { heading: 'Term', align: 'left' },
      { heading: 'Coefficient', align: 'right', ...(logScale ? {} : { unit: cur }) },
      { heading: 'Std error', align: 'right', ...(logScale ? {} : { unit: cur }) },
      { heading: 't', align: 'right' },
      { heading: 'p', align: 'right' },
      { heading: 'Standardized (beta)', align: 'right' },
      { heading: 'VIF', align: 'right' },
      { heading: 'Meaning', align: 'left', wrap: true },
    ],
    rows: r.coefficients.map((c) => {
      const isIntercept = c.term === '(intercept)';
      const meaning = isIntercept
        ? logScale
          ? 'log price at zero of every predictor'
          : 'price at zero of every predictor'
        : logScale
          ? `${percentEffect(c.estimate)} ${perUnitLabel(c.term as Exclude<typeof c.term, '(intercept)'>, unit)}`
          : perUnitLabel(c.term as Exclude<typeof c.term, '(intercept)'>, unit);
      return [
        textCell(isIntercept ? 'Intercept' : predictorLabel(c.term as Exclude<typeof c.term, '(intercept)'>, unit)),
        value(c.estimate),
        value(c.stdError),
        fixedCell(c.t, 2),
        pValueCell(c.p),
        fixedCell(c.standardized, 3),
        fixedCell(c.vif, 2),
        textCell(meaning),
      ];
    }),
    note: logScale
      ? 'Coefficients on the natural-log price scale; the meaning column gives the price change per unit.'
      : `Coefficients in ${cur} per unit of each predictor. Standardized: change in price, in standard deviations, per standard deviation of the predictor.`,
  };
  return { id: 'coefficients', heading: 'Coefficients', blocks: [{ kind: 'table', table }] };
}

/** PRESS is in squared price units: scientific notation keeps it readable. */
function pressCell(x: number): Cell {
  if (!Number.isFinite(x)) return textCell('');
  if (Math.abs(x) < 1e6) return significantCell(x, 4);
  const text = x.toExponential(3);
  return { text, value: Number(text) };
}

function fitSection(saved: SavedEstimate): WorksheetSection {
  const r = saved.result;
  const f = r.fit;
  const cur = saved.market.currency;
  const k = r.predictors.length;
  const bp = r.residualTests.breuschPagan;
  const jb = r.residualTests.jarqueBera;
  const fields: Field[] = [
    field('R²', fixedCell(f.rSquared, 4)),
    field('Adjusted R²', fixedCell(f.adjRSquared, 4)),
    r.transform === 'log' ? field('Residual standard error s (log scale)', fixedCell(f.sigma, 4)) : field('Residual standard error s', priceCell(f.sigma, cur)),
    field(`F statistic on ${k} and ${f.dfResidual} degrees of freedom`, fixedCell(f.fStatistic, 2)),
    field('p of F', pValueCell(f.fPValue)),
    field('Residual degrees of freedom', integerCell(f.dfResidual)),
    field('Condition number', fixedCell(f.conditionNumber, 1)),
    field('Condition indices', textCell(f.conditionIndices.map((c) => fixedCell(c, 1).text).join(', '))),
    field(`Breusch-Pagan (Koenker), chi-square on ${bp.df} df`, fixedCell(bp.statistic, 2)),
    field('Breusch-Pagan p', pValueCell(bp.p)),
    field('Jarque-Bera, chi-square on 2 df', fixedCell(jb.statistic, 2)),
    field('Jarque-Bera p', pValueCell(jb.p)),
    field('Residual skewness', fixedCell(jb.skewness, 3)),
    field('Residual kurtosis', fixedCell(jb.kurtosis, 3)),
  ];
  const v = r.validation;
  const ratioStudy: WorksheetTable = {
    id: 'ratio-study',
    heading: 'Leave-one-out ratio study',
    columns: [
      { heading: 'Measure', align: 'left' },
      { heading: 'Value', align: 'right' },
      { heading: 'Usual range (IAAO, advisory)', align: 'left', wrap: true },
    ],
    rows: [
      [textCell('Sales in the study'), integerCell(v.count), textCell('')],
      [textCell(r.transform === 'log' ? 'PRESS (log scale)' : 'PRESS'), pressCell(v.press), textCell('')],
      [textCell('Predicted R²'), fixedCell(v.predictedRSquared, 4), textCell('close to R²')],
      [textCell('Median ratio'), fixedCell(v.medianRatio, 3), textCell('0.90 to 1.10')],
      [textCell('Mean ratio'), fixedCell(v.meanRatio, 3), textCell('')],
      [textCell('Weighted mean ratio'), fixedCell(v.weightedMeanRatio, 3), textCell('')],
      [textCell('COD'), fixedCell(v.cod, 1), textCell('15 or less for residential property')],
      [textCell('PRD'), fixedCell(v.prd, 3), textCell('0.98 to 1.03')],
      [textCell('PRB'), fixedCell(v.prb, 3), textCell('between -0.05 and 0.05')],
    ],
    note:
      'Each sale predicted from all the other sales and compared with its price. The ranges are those used for assessment ratio studies; they are advisory, and over few sales the study is indicative only.',
  };
  return {
    id: 'fit',
    heading: 'Fit and leave-one-out check',
    blocks: [
      { kind: 'fields', id: 'fit', fields },
      { kind: 'table', table: ratioStudy },
    ],
  };
}

export function worksheetSections(saved: SavedEstimate, interval: IntervalView, charts: ChartView[]): WorksheetSection[] {
  const r = saved.result;
  return [
    estimateSection(saved, interval),
    warningsSection(r),
    subjectSection(saved),
    modelSection(saved),
    coefficientsSection(saved),
    fitSection(saved),
    { id: 'pictures', heading: 'Pictures', blocks: [{ kind: 'charts', charts }] },
    { id: 'adjustment-grid', heading: 'Adjustment grid', blocks: [{ kind: 'table', table: adjustmentGridTable(saved) }] },
    {
      id: 'sales',
      heading: 'Sales used',
      blocks: [
        { kind: 'table', table: salesUsedTable(saved) },
        { kind: 'table', table: diagnosticsTable(saved) },
      ],
    },
    { id: 'method', heading: 'Method and sources', blocks: [{ kind: 'paragraphs', id: 'method', paragraphs: methodParagraphs(r.transform) }] },
  ];
}
