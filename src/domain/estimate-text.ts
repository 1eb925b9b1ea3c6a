/**
 * A plain-text summary of an estimate for the terminal (`compfit estimate --format text`):
 * value and intervals first, warnings next, then the model, and the caution last.
 */
import { CAUTION_TEXT } from './cautions.js';
import type { EstimateResult } from './estimate-result.js';

const money = (x: number) => Math.round(x).toLocaleString('en-US');
const num = (x: number | null, digits = 4) => (x === null || !Number.isFinite(x) ? '—' : Math.abs(x) >= 1e5 ? x.toExponential(3) : x.toFixed(digits));

export function estimateText(r: EstimateResult, subjectAddress: string): string {
  const pct = `${+(r.level * 100).toFixed(2)} %`;
  const lines: string[] = [];
  lines.push(`Estimate for ${subjectAddress}`);
  lines.push(`  value                 ${money(r.estimate.value)}`);
  if (r.transform === 'log') lines.push(`  median (exp of fit)   ${money(r.estimate.median)}  (smearing factor ${r.estimate.smearingFactor.toFixed(4)})`);
  lines.push(`  ${pct} prediction    ${money(r.estimate.prediction[0])} to ${money(r.estimate.prediction[1])}`);
  lines.push(`  ${pct} confidence    ${money(r.estimate.confidence[0])} to ${money(r.estimate.confidence[1])}  (mean price of such properties)`);
  lines.push(`  subject leverage      ${r.estimate.leverage.toFixed(4)} (largest among sales ${r.estimate.maxLeverage.toFixed(4)})`);
  lines.push('');
  if (r.warnings.length > 0) {
    lines.push('Warnings');
    for (const w of r.warnings) lines.push(`  [${w.severity}] ${w.code}: ${w.message}`);
    lines.push('');
  }
  lines.push(`Model: ${r.transform === 'log' ? 'ln(sale price)' : 'sale price'} on ${r.predictors.join(', ')}; ${r.n} sales used`);
  lines.push('  term                 estimate        std error       t        p       beta     VIF');
  for (const c of r.coefficients)
    lines.push(
      `  ${c.term.padEnd(18)} ${num(c.estimate).padStart(12)} ${num(c.stdError).padStart(14)} ${num(c.t, 2).padStart(8)} ${(c.p < 0.0001 ? '< 0.0001' : num(c.p)).padStart(8)} ${num(c.standardized, 3).padStart(8)} ${num(c.vif, 2).padStart(7)}`,
    );
  const f = r.fit;
  lines.push(`  R² ${f.rSquared.toFixed(4)}, adjusted R² ${f.adjRSquared.toFixed(4)}, sigma ${num(f.sigma)}, F ${f.fStatistic.toFixed(2)} (p ${f.fPValue < 0.0001 ? '< 0.0001' : f.fPValue.toPrecision(3)}), df ${f.dfResidual}, condition number ${f.conditionNumber.toFixed(1)}`);
  const v = r.validation;
  lines.push(`  leave-one-out: predicted R² ${v.predictedRSquared.toFixed(4)}, median ratio ${v.medianRatio.toFixed(3)}, COD ${v.cod.toFixed(1)}, PRD ${v.prd.toFixed(3)}, PRB ${v.prb.toFixed(3)}`);
  lines.push('');
  lines.push(`Adjustment grid (6 sales with the smallest gross adjustment of ${r.grid.length})`);
  for (const g of r.grid.slice(0, 6))
    lines.push(`  ${g.id.padEnd(14)} price ${money(g.salePrice).padStart(11)}  adjusted ${money(g.adjustedPrice).padStart(11)}  net ${g.netPercent.toFixed(1).padStart(6)} %  gross ${g.grossPercent.toFixed(1).padStart(6)} %`);
  lines.push('');
  lines.push(`Caution: ${CAUTION_TEXT}`);
  return lines.join('\n') + '\n';
}
