/**
 * Saved estimates: written once, never updated (there is no update or delete here on
 * purpose). Each row freezes the market snapshot, subject, model, the exact sale rows, the
 * Result JSON, who, when and the app version; reading maps it back to a SavedEstimate.
 */
import { desc, eq } from 'drizzle-orm';
import type { EstimateResult } from '../domain/estimate-result.js';
import type { ModelSpec } from '../domain/model.js';
import type { Sale, Subject } from '../domain/sale.js';
import type { MarketSnapshot, SavedEstimate } from '../domain/saved-estimate.js';
import type { Database } from './database.js';
import { toDomainSale } from './sale-columns.js';
import { estimates, type EstimateRow } from './schema.js';

export interface EstimateListItem {
  id: number;
  createdAt: string;
  createdBy: string;
  subjectAddress: string;
  effectiveDate: string;
  value: number;
  prediction: [number, number];
  warningCount: number;
}

export async function saveEstimate(db: Database, snapshot: Omit<SavedEstimate, 'id'>): Promise<number> {
  const [row] = await db
    .insert(estimates)
    .values({
      marketId: snapshot.market.id,
      createdAt: snapshot.createdAt,
      createdBy: snapshot.createdBy,
      appVersion: snapshot.appVersion,
      marketJson: JSON.stringify(snapshot.market),
      subjectJson: JSON.stringify(snapshot.subject),
      modelJson: JSON.stringify(snapshot.model),
      // A sale as kept in a snapshot: the domain fields only, no database keys or times.
      salesJson: JSON.stringify(snapshot.sales.map(toDomainSale)),
      resultJson: JSON.stringify(snapshot.result),
    })
    .returning({ id: estimates.id });
  return row.id;
}

function rowToSaved(row: EstimateRow): SavedEstimate {
  return {
    id: row.id,
    market: JSON.parse(row.marketJson) as MarketSnapshot,
    createdAt: row.createdAt,
    createdBy: row.createdBy,
    appVersion: row.appVersion,
    subject: JSON.parse(row.subjectJson) as Subject,
    model: JSON.parse(row.modelJson) as ModelSpec,
    sales: JSON.parse(row.salesJson) as Sale[],
    result: JSON.parse(row.resultJson) as EstimateResult,
  };
}

export async function findEstimate(db: Database, id: number): Promise<SavedEstimate | undefined> {
  const [row] = await db.select().from(estimates).where(eq(estimates.id, id)).limit(1);
  return row ? rowToSaved(row) : undefined;
}

/** A market's saved estimates, newest first. */
export async function listEstimates(db: Database, marketId: number): Promise<EstimateListItem[]> {
  const rows = await db.select().from(estimates).where(eq(estimates.marketId, marketId)).orderBy(desc(estimates.createdAt), desc(estimates.id));
  return rows.map((row) => {
    const subject = JSON.parse(row.subjectJson) as Subject;
    const result = JSON.parse(row.resultJson) as EstimateResult;
    return {
      id: row.id,
      createdAt: row.createdAt,
      createdBy: row.createdBy,
      subjectAddress: subject.address,
      effectiveDate: subject.effectiveDate,
      value: result.estimate.value,
      prediction: result.estimate.prediction,
      warningCount: result.warnings.filter((w) => w.severity !== 'info').length,
    };
  });
}
