/**
 * Saved estimates for the worksheet tests, built from the demo market's generated sales
 * (seed/demo-sales.ts) and the demo subject, with a fixed save time, so every run builds
 * the same snapshot.
 */
import { runEstimate } from '../../src/domain/estimate.js';
import type { ModelSpec } from '../../src/domain/model.js';
import type { Sale, Subject } from '../../src/domain/sale.js';
import type { MarketSnapshot, SavedEstimate } from '../../src/domain/saved-estimate.js';
import { parseSubject } from '../../src/domain/subject-json.js';
import { DEMO_MARKET, generateDemoSales } from '../../seed/demo-sales.js';
import demoSubjectJson from '../../seed/demo-subject.json' with { type: 'json' };

export const DEMO_MODEL: ModelSpec = {
  predictors: ['living_area', 'age', 'rooms', 'bathrooms', 'garage_spaces', 'months_since_sale'],
  transform: 'none',
  level: 0.95,
};

export function demoSubject(): Subject {
  const parsed = parseSubject(demoSubjectJson);
  if (!parsed.ok) throw new Error(`demo subject: ${JSON.stringify(parsed.errors)}`);
  return parsed.value;
}

export function savedEstimate(options: {
  sales?: Sale[];
  subject?: Subject;
  model?: ModelSpec;
  market?: Partial<MarketSnapshot>;
  id?: number;
} = {}): SavedEstimate {
  const sales = options.sales ?? generateDemoSales();
  const subject = options.subject ?? demoSubject();
  const model = options.model ?? DEMO_MODEL;
  return {
    id: options.id ?? 17,
    market: { id: 3, name: DEMO_MARKET.name, areaUnit: DEMO_MARKET.areaUnit, currency: DEMO_MARKET.currency, ...options.market },
    createdAt: '2024-12-16T15:04:05.000Z',
    createdBy: 'Avery Demo',
    appVersion: '0.1.0',
    subject,
    model,
    sales: structuredClone(sales),
    result: runEstimate(sales, subject, model),
  };
}
