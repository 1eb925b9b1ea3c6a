/**
 * A saved estimate: an immutable snapshot of everything one estimate rests on — the market
 * as it was, the exact sale rows used, the subject, the model, the Result JSON, who and when,
 * and the app version (the workfile record of TRADE-FACTS.md §10, USPAP Record Keeping Rule).
 * Reopening it never recomputes: pages and worksheets read these fields as saved.
 */
import type { EstimateResult } from './estimate-result.js';
import type { ModelSpec } from './model.js';
import type { Sale, Subject } from './sale.js';

export type AreaUnitCode = 'sqft' | 'm2';

export interface MarketSnapshot {
  id: number;
  name: string;
  areaUnit: AreaUnitCode;
  currency: string;
}

export interface SavedEstimate {
  id: number;
  market: MarketSnapshot;
  /** ISO timestamp (UTC) of saving. */
  createdAt: string;
  createdBy: string;
  appVersion: string;
  subject: Subject;
  model: ModelSpec;
  /** Every sale of the market at saving time, as the estimate read them (used and left out). */
  sales: Sale[];
  result: EstimateResult;
}
