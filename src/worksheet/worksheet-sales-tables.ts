/**
 * The per-sale tables of a worksheet: the adjustment grid, the sales used with their
 * recorded characteristics, their diagnostics with flags, and the sales left out with the
 * reason. Rows come from the snapshot's sales and Result JSON only.
 */
import { isLargeAdjustment } from '../domain/adjustment-grid.js';
import type { Predictor } from '../domain/estimate-result.js';
import { areaLabel } from '../domain/format.js';
import { CHARACTERISTIC_RULES, CHARACTERISTICS, type Characteristic, type Sale } from '../domain/sale.js';
import type { SavedEstimate } from '../domain/saved-estimate.js';
import {
  fixedCell,
  integerCell,
  percentCell,
  priceCell,
  quantityCell,
  signedPriceCell,
  textCell,
  type Cell,
} from './worksheet-cells.js';
import type { Column, WorksheetTable } from './worksheet-model.js';

/** Short column headings for a predictor's adjustment (time is "market conditions" in the trade). */
export const PREDICTOR_HEADING: Record<Predictor, string> = {
  living_area: 'Living area',
  age: 'Age',
  rooms: 'Rooms',
  bedrooms: 'Bedrooms',
  bathrooms: 'Bathrooms',
  lot_area: 'Lot area',
  garage_spaces: 'Garage spaces',
  months_since_sale: 'Market conditions',
  'living_area^2': 'Living area²',
};

const right = (heading: string, unit?: string): Column => ({ heading, align: 'right', ...(unit ? { unit } : {}) });
const left = (heading: string, wrap = false): Column => ({ heading, align: 'left', ...(wrap ? { wrap } : {}) });

/** A characteristic as recorded: years without a thousands separator, half baths kept. */
export function characteristicCell(c: Characteristic, x: number | undefined): Cell {
  if (x === undefined) return textCell('');
  if (c === 'year_built') return { text: String(x), value: x };
  return CHARACTERISTIC_RULES[c].integer ? integerCell(x) : quantityCell(x);
}

export function saleLookup(saved: SavedEstimate): Map<string, Sale> {
  return new Map(saved.sales.map((s) => [s.id, s]));
}

export function adjustmentGridTable(saved: SavedEstimate): WorksheetTable {
  const { result, market } = saved;
  const cur = market.currency;
  const logScale = result.transform === 'log';
  return {
    id: 'adjustment-grid',
    heading: 'Adjustment grid',
    columns: [
      left('Sale'),
      right('Sale price', cur),
      ...result.predictors.map((p) => right(`${PREDICTOR_HEADING[p]} adjustment`, cur)),
      right('Adjusted price', cur),
      right('Net', '%'),
      right('Gross', '%'),
      left('Flag'),
    ],
    rows: result.grid.map((g) => [
      textCell(g.id),
      priceCell(g.salePrice, cur),
      ...result.predictors.map((p) => signedPriceCell(g.adjustments[p], cur)),
      priceCell(g.adjustedPrice, cur),
      percentCell(g.netPercent),
      percentCell(g.grossPercent),
      textCell(isLargeAdjustment(g) ? 'large' : ''),
    ]),
    note:
      `Each sale's price adjusted toward the subject by the fitted coefficients, in ${cur}; smallest gross adjustment first, so the sales most like the subject lead. ` +
      (logScale
        ? 'Log model: each column is the change that predictor makes alone; the changes multiply, so they need not add up to the adjusted price. '
        : 'The adjustments of a row add up to the adjusted price. ') +
      'Flag "large": above 15 % net or 25 % gross, a former lender guideline shown as a flag only.',
  };
}

export function salesUsedTable(saved: SavedEstimate): WorksheetTable {
  const bySale = saleLookup(saved);
  const used = saved.result.sales.filter((d) => d.used).map((d) => bySale.get(d.id)).filter((s): s is Sale => s !== undefined);
  const shown = CHARACTERISTICS.filter((c) => used.some((s) => s.characteristics[c] !== undefined));
  const cur = saved.market.currency;
  const unit = areaLabel(saved.market.areaUnit);
  const heading = (c: Characteristic) => {
    const r = CHARACTERISTIC_RULES[c];
    return r.unit === 'area' ? `${r.label} (${unit})` : r.label;
  };
  return {
    id: 'sales-used',
    heading: 'Sales used',
    columns: [
      left('Sale'),
      left('Address', true),
      left('Sale date'),
      right('Sale price', cur),
      ...shown.map((c) => right(heading(c), CHARACTERISTIC_RULES[c].unit === 'area' ? unit : undefined)),
      left('Verification', true),
    ],
    rows: used.map((s) => [
      textCell(s.id),
      textCell(s.address),
      textCell(s.saleDate),
      priceCell(s.salePrice, cur),
      ...shown.map((c) => characteristicCell(c, s.characteristics[c])),
      textCell(s.verification),
    ]),
    note: `The ${used.length} sales the model was fitted to, as recorded when the estimate was saved.`,
  };
}

export function diagnosticsTable(saved: SavedEstimate): WorksheetTable {
  const { result, market } = saved;
  const cur = market.currency;
  const bySale = saleLookup(saved);
  const logScale = result.transform === 'log';
  const n = result.n;
  const p = result.predictors.length + 1;
  const rows = result.sales.filter((d) => d.used);
  return {
    id: 'diagnostics',
    heading: 'Diagnostics of the sales used',
    columns: [
      left('Sale'),
      right('Fitted price', cur),
      right(logScale ? 'Residual (log)' : 'Residual', logScale ? undefined : cur),
      right('Leverage'),
      right('Studentized'),
      right("Cook's D"),
      right('DFFITS'),
      right('Leave-one-out prediction', cur),
      right('Ratio'),
      left('Flags'),
    ],
    rows: rows.map((d) => {
      const price = bySale.get(d.id)?.salePrice;
      const ratio = d.looPrediction !== null && price ? d.looPrediction / price : null;
      return [
        textCell(d.id),
        priceCell(d.fitted, cur),
        logScale ? fixedCell(d.residual, 4) : signedPriceCell(d.residual, cur),
        fixedCell(d.leverage, 3),
        fixedCell(d.studentized, 2),
        fixedCell(d.cooksDistance, 3),
        fixedCell(d.dffits, 3),
        priceCell(d.looPrediction, cur),
        fixedCell(ratio, 3),
        textCell(d.flags.join(', ')),
      ];
    }),
    note:
      `Studentized: externally studentized residual. Ratio: leave-one-out prediction / sale price. Flags: high-leverage above 2p/n = ${(2 * p / n).toFixed(3)}` +
      `${2 * p / n >= 1 ? ' (not used: at or above 1)' : ''}; outlier beyond ±3; influential above 4/n = ${(4 / n).toFixed(3)}; very-influential above 1.`,
  };
}

export function salesLeftOutTable(saved: SavedEstimate): WorksheetTable {
  const bySale = saleLookup(saved);
  const cur = saved.market.currency;
  const rows = saved.result.sales.filter((d) => !d.used);
  return {
    id: 'sales-left-out',
    heading: 'Sales left out',
    columns: [left('Sale'), left('Address', true), left('Sale date'), right('Sale price', cur), left('Reason', true)],
    rows: rows.map((d) => {
      const s = bySale.get(d.id);
      return [textCell(d.id), textCell(s?.address), textCell(s?.saleDate), priceCell(s?.salePrice, cur), textCell(d.excludedReason)];
    }),
    empty: 'Every sale of the market was used.',
  };
}
