/**
 * Every warning of DESIGN.md "Warning codes", read off a finished result. Thresholds and
 * their sources (reference/TRADE-FACTS.md):
 *   outside-range: subject below the smallest or above the largest sale value (§4, common practice)
 *   hidden-extrapolation: h₀ > max hᵢᵢ (Montgomery, Peck & Vining §3.8; §4)
 *   collinearity: VIF > 5 caution, > 10 serious (§3); condition index > 30 with two or more
 *     variance-decomposition proportions > 0.5 (Belsley, Kuh & Welsch 1980)
 *   small-sample: fewer than 10 sales per coefficient or fewer than 30 sales caution, fewer
 *     than 10 sales or 5 residual df serious (§6; Harrell 2015 §4.4; common practice)
 *   outlier-sale: |tᵢ| > 3; influential-sale: Dᵢ > 4/n (caution), > 1 (serious);
 *   high-leverage-sale: hᵢᵢ > 2p/n (Hoaglin & Welsch 1978) (§5)
 *   nonconstant-variance: Koenker–Breusch–Pagan p < 0.05; non-normal-residuals: Jarque–Bera
 *     p < 0.05, advisory below 30 sales (§8)
 *   large-adjustment: over 15 % net or 25 % gross (§10, a former guideline; a flag only)
 *   market-conditions (an extension of the list): sales over more than 12 months and no
 *     months_since_sale term (common practice)
 */
import { isLargeAdjustment, LARGE_GROSS_PERCENT, LARGE_NET_PERCENT } from './adjustment-grid.js';
import type { EstimateResult, EstimateWarning, ModelFitSummary } from './estimate-result.js';
import type { ConditionDiagnostics } from '../stats/condition-indices.js';
import { predictorWords } from './model.js';

/** A p value in words: tiny ones as an upper bound, not as 0. */
const fmtP = (p: number) => (p < 0.0001 ? '< 0.0001' : `= ${p.toPrecision(2)}`);

const fmt = (x: number) => (Math.abs(x) >= 100 || Number.isInteger(x) ? Math.round(x).toLocaleString('en-US') : x.toFixed(2));

/** Warnings carry at most this many sale ids (with the full count); every sale's flags are in `sales`. */
const MAX_IDS = 100;
const capped = <T,>(ids: T[]) => (ids.length > MAX_IDS ? ids.slice(0, MAX_IDS) : ids);

function listIds(ids: string[], max = 8): string {
  return ids.length <= max ? ids.join(', ') : `${ids.slice(0, max).join(', ')} and ${ids.length - max} more`;
}

/** Warnings about the subject: outside the sales' ranges, unlike any sale, large adjustments. */
export function subjectWarnings(r: EstimateResult): EstimateWarning[] {
  const w: EstimateWarning[] = [];

  let outside = 0;
  for (const predictor of r.predictors) {
    if (predictor === 'months_since_sale') continue; // the subject's 0 is the effective date itself
    const { min, max, subject } = r.ranges[predictor];
    if (subject < min || subject > max) {
      outside++;
      w.push({
        code: 'outside-range',
        severity: 'serious',
        predictor,
        subjectValue: subject,
        min,
        max,
        message: `The subject's ${predictorWords(predictor)} (${fmt(subject)}) is ${subject < min ? 'below the smallest' : 'above the largest'} among the sales used (${fmt(min)} to ${fmt(max)}). The estimate extrapolates beyond what the sales support.`,
      });
    }
  }
  if (r.estimate.leverage > r.estimate.maxLeverage)
    w.push({
      code: 'hidden-extrapolation',
      severity: 'serious',
      leverage: r.estimate.leverage,
      maxLeverage: r.estimate.maxLeverage,
      message:
        outside === 0
          ? `Each of the subject's values lies within the range of the sales, but the combination is unlike any sale used: its leverage ${r.estimate.leverage.toFixed(3)} exceeds the largest among the sales (${r.estimate.maxLeverage.toFixed(3)}). The estimate extrapolates.`
          : `The subject's combination of characteristics is also unlike any sale used: its leverage ${r.estimate.leverage.toFixed(3)} exceeds the largest among the sales (${r.estimate.maxLeverage.toFixed(3)}).`,
    });

  const large = r.grid.filter(isLargeAdjustment).map((g) => g.id);
  if (large.length > 0)
    w.push({
      code: 'large-adjustment',
      severity: 'info',
      sales: capped(large),
      count: large.length,
      message: `${large.length} of ${r.grid.length} sales need adjustments above ${LARGE_NET_PERCENT} % net or ${LARGE_GROSS_PERCENT} % gross (a former lender guideline, a flag and not a rule): prefer more similar sales in the grid.`,
    });

  return w;
}

/** Warnings about the model and the sales, whatever the subject. */
export function modelWarnings(
  r: ModelFitSummary,
  conditioning: ConditionDiagnostics,
  saleDates?: { first: string; last: string },
): EstimateWarning[] {
  const w: EstimateWarning[] = [];
  const n = r.n;
  const p = r.predictors.length + 1;
  const used = r.sales.filter((s) => s.used && s.flags.length > 0);

  const squaredPair = new Set(['living_area', 'living_area^2']);
  for (const c of r.coefficients) {
    if (c.vif === null || !(c.vif > 5)) continue;
    const expected = r.predictors.includes('living_area^2') && squaredPair.has(c.term);
    w.push({
      code: 'collinearity',
      severity: expected ? 'info' : c.vif > 10 ? 'serious' : 'caution',
      predictor: c.term,
      vif: c.vif,
      message: expected
        ? `${predictorWords(c.term)} has VIF ${c.vif.toFixed(1)}, as expected for a squared term and its base; read the two coefficients together.`
        : `${predictorWords(c.term)} has VIF ${c.vif.toFixed(1)} (above ${c.vif > 10 ? 10 : 5}): it is strongly explained by the other predictors, so its coefficient and adjustment are unstable.`,
    });
  }
  const terms = ['(intercept)', ...r.predictors];
  conditioning.indices.forEach((index, k) => {
    const involved = terms.filter((_, j) => conditioning.proportions[k][j] > 0.5);
    if (index > 30 && involved.length >= 2) {
      const onlySquare = involved.every((t) => squaredPair.has(t) || t === '(intercept)') && r.predictors.includes('living_area^2');
      w.push({
        code: 'collinearity',
        severity: onlySquare ? 'info' : 'caution',
        conditionIndex: index,
        terms: involved,
        message: `Condition index ${index.toFixed(0)} (above 30) ties together ${involved.map(predictorWords).join(', ')}: these terms are nearly dependent among the sales used.`,
      });
    }
  });

  if (n < 10 || r.fit.dfResidual < 5)
    w.push({
      code: 'small-sample',
      severity: 'serious',
      n,
      message: `Only ${n} sales for ${p} coefficients (${r.fit.dfResidual} residual degrees of freedom): intervals are very wide and diagnostics unreliable.`,
    });
  else if (n < Math.max(30, 10 * p))
    w.push({
      code: 'small-sample',
      severity: 'caution',
      n,
      message: `${n} sales for ${p} coefficients: fewer than the usual ${Math.max(30, 10 * p)} for a stable model (about 10 per coefficient, 30 at least).`,
    });

  const outliers = used.filter((s) => s.flags.includes('outlier')).map((s) => s.id);
  if (outliers.length > 0)
    w.push({
      code: 'outlier-sale',
      severity: 'caution',
      sales: capped(outliers),
      count: outliers.length,
      message: `Sale${outliers.length > 1 ? 's' : ''} ${listIds(outliers)} ${outliers.length > 1 ? 'are' : 'is'} far from the fitted prices (studentized residual beyond ±3): verify ${outliers.length > 1 ? 'them' : 'it'}.`,
    });
  const influential = used.filter((s) => s.flags.includes('influential')).map((s) => s.id);
  if (influential.length > 0) {
    const strong = used.filter((s) => s.flags.includes('very-influential')).map((s) => s.id);
    w.push({
      code: 'influential-sale',
      severity: strong.length > 0 ? 'serious' : 'caution',
      sales: capped(influential),
      count: influential.length,
      message:
        strong.length > 0
          ? `Sale${strong.length > 1 ? 's' : ''} ${listIds(strong)} alone move${strong.length > 1 ? '' : 's'} the fit (Cook's distance above 1); ${influential.length} sale${influential.length === 1 ? '' : 's'} in all exceed${influential.length === 1 ? 's' : ''} 4/n.`
          : `Sale${influential.length > 1 ? 's' : ''} ${listIds(influential)} have Cook's distance above 4/n = ${(4 / n).toFixed(3)}: the fit leans on them.`,
    });
  }
  const leveraged = used.filter((s) => s.flags.includes('high-leverage')).map((s) => s.id);
  if (leveraged.length > 0)
    w.push({
      code: 'high-leverage-sale',
      severity: 'info',
      sales: capped(leveraged),
      count: leveraged.length,
      message: `Sale${leveraged.length > 1 ? 's' : ''} ${listIds(leveraged)} ${leveraged.length > 1 ? 'have' : 'has'} unusual characteristics (leverage above 2p/n = ${((2 * p) / n).toFixed(3)}).`,
    });

  const bp = r.residualTests.breuschPagan;
  if (bp.p < 0.05)
    w.push({
      code: 'nonconstant-variance',
      severity: 'caution',
      statistic: bp.statistic,
      p: bp.p,
      message: `The spread of residuals changes with the predictors (Breusch–Pagan, Koenker form: ${bp.statistic.toFixed(2)}, p ${fmtP(bp.p)}), so the interval is too narrow for some properties and too wide for others${r.transform === 'none' ? '; a log price model may help' : ''}.`,
    });
  const jb = r.residualTests.jarqueBera;
  if (jb.p < 0.05)
    w.push({
      code: 'non-normal-residuals',
      severity: n < 30 ? 'info' : 'caution',
      statistic: jb.statistic,
      p: jb.p,
      message: `Residuals do not look normal (Jarque–Bera ${jb.statistic.toFixed(2)}, p ${fmtP(jb.p)})${n < 30 ? '; with so few sales this test is only advisory' : ''}: the prediction interval's coverage is approximate.`,
    });

  // Prices move with the market; over more than a year an unadjusted model mixes price levels
  // (market conditions are an element of comparison: TRADE-FACTS.md §10).
  if (saleDates && !r.predictors.includes('months_since_sale')) {
    const months = (Date.parse(saleDates.last) - Date.parse(saleDates.first)) / 86_400_000 / 30.4375;
    if (months > 12)
      w.push({
        code: 'market-conditions',
        severity: 'caution',
        firstSale: saleDates.first,
        lastSale: saleDates.last,
        months,
        message: `The sales used span ${Math.round(months)} months (${saleDates.first} to ${saleDates.last}) but the model has no market-conditions term: add months since sale, or check that prices did not move over that time.`,
      });
  }

  const leftOut = r.sales.filter((s) => !s.used);
  if (leftOut.length > 0)
    w.push({
      code: 'sales-left-out',
      severity: 'info',
      sales: capped(leftOut.map((s) => ({ id: s.id, reason: s.excludedReason }))),
      count: leftOut.length,
      message: `${leftOut.length} sale${leftOut.length > 1 ? 's were' : ' was'} not used: ${listIds(leftOut.map((s) => `${s.id} (${s.excludedReason})`), 5)}.`,
    });

  return w;
}

/** Serious first, then caution, then info; the order within a severity is kept. */
export function sortWarnings(warnings: EstimateWarning[]): EstimateWarning[] {
  const order = { serious: 0, caution: 1, info: 2 } as const;
  return warnings.sort((a, b) => order[a.severity] - order[b.severity]);
}
