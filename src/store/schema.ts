/**
 * The database schema, the single source of truth: drizzle-kit generates the SQL
 * migrations in db/migrations from this file, and row types come from the tables
 * (`$inferSelect`). Times are ISO 8601 text in UTC; dates are ISO `YYYY-MM-DD` text.
 */
import { sql } from 'drizzle-orm';
import { index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ', 'now'))`;

/** A named market area with its area unit and currency (DESIGN.md "market"). */
export const markets = sqliteTable(
  'markets',
  {
    id: integer('id').primaryKey(),
    name: text('name').notNull(),
    /** `sqft` or `m2`: the unit of living_area and lot_area for every sale of the market. */
    areaUnit: text('area_unit', { enum: ['sqft', 'm2'] }).notNull().default('sqft'),
    /** ISO 4217 code, e.g. USD. */
    currency: text('currency').notNull().default('USD'),
    notes: text('notes'),
    /**
     * Bumped by database triggers on every insert, update or delete of the market's sales
     * (db/migrations/0003_sales_revision_triggers.sql), so any app process can tell in one
     * cheap read whether its cached fit of these sales is still current.
     */
    salesRevision: integer('sales_revision').notNull().default(0),
    createdAt: text('created_at').notNull().default(now),
    updatedAt: text('updated_at').notNull().default(now),
  },
  (t) => [uniqueIndex('markets_name_unique').on(t.name)],
);

/** An import of a CSV file: previewed first, written only when committed. */
export const importBatches = sqliteTable('import_batches', {
  id: integer('id').primaryKey(),
  marketId: integer('market_id')
    .notNull()
    .references(() => markets.id, { onDelete: 'cascade' }),
  fileName: text('file_name').notNull(),
  /** `previewed` (waiting for commit) or `committed`. */
  status: text('status', { enum: ['previewed', 'committed'] }).notNull(),
  rowCount: integer('row_count').notNull(),
  /** The uploaded text, kept between preview and commit and cleared on commit. */
  csvText: text('csv_text'),
  createdAt: text('created_at').notNull().default(now),
  createdBy: text('created_by').notNull(),
  committedAt: text('committed_at'),
});

/** One closed comparable sale (DESIGN.md "sale"); characteristics are nullable columns. */
export const sales = sqliteTable(
  'sales',
  {
    id: integer('id').primaryKey(),
    marketId: integer('market_id')
      .notNull()
      .references(() => markets.id, { onDelete: 'cascade' }),
    /** The user's own reference (CSV `id`), unique within the market. */
    ref: text('ref').notNull(),
    address: text('address').notNull(),
    saleDate: text('sale_date').notNull(),
    salePrice: real('sale_price').notNull(),
    livingArea: real('living_area'),
    yearBuilt: integer('year_built'),
    rooms: integer('rooms'),
    bedrooms: integer('bedrooms'),
    bathrooms: real('bathrooms'),
    lotArea: real('lot_area'),
    garageSpaces: integer('garage_spaces'),
    verification: text('verification'),
    notes: text('notes'),
    included: integer('included', { mode: 'boolean' }).notNull().default(true),
    excludedReason: text('excluded_reason'),
    importBatchId: integer('import_batch_id').references(() => importBatches.id, { onDelete: 'set null' }),
    createdAt: text('created_at').notNull().default(now),
    updatedAt: text('updated_at').notNull().default(now),
  },
  (t) => [
    uniqueIndex('sales_market_ref_unique').on(t.marketId, t.ref),
    index('sales_market_date_idx').on(t.marketId, t.saleDate),
  ],
);

/**
 * The change history of every sale: who did what when, with the sale before and after
 * as JSON (a domain Sale). `sale_id` is not a foreign key so the history outlives a
 * deleted sale and can restore it.
 */
export const saleChanges = sqliteTable(
  'sale_changes',
  {
    id: integer('id').primaryKey(),
    marketId: integer('market_id')
      .notNull()
      .references(() => markets.id, { onDelete: 'cascade' }),
    saleId: integer('sale_id').notNull(),
    at: text('at').notNull().default(now),
    by: text('by').notNull(),
    action: text('action', { enum: ['create', 'import', 'update', 'exclude', 'include', 'delete', 'restore'] }).notNull(),
    beforeJson: text('before_json'),
    afterJson: text('after_json'),
  },
  (t) => [index('sale_changes_sale_idx').on(t.saleId, t.id)],
);

/**
 * People who sign in. `password_hash` is `scrypt$N$r$p$<base64 key>` (the scrypt cost
 * parameters travel with the hash, so they can be raised later); `salt` is random per user.
 */
export const users = sqliteTable(
  'users',
  {
    id: integer('id').primaryKey(),
    name: text('name').notNull(),
    passwordHash: text('password_hash').notNull(),
    salt: text('salt').notNull(),
    createdAt: text('created_at').notNull().default(now),
  },
  (t) => [uniqueIndex('users_name_unique').on(t.name)],
);

/** Signed-in sessions; `id` holds a hash of the token, never the token itself. */
export const sessions = sqliteTable(
  'sessions',
  {
    id: text('id').primaryKey(),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: text('created_at').notNull().default(now),
    expiresAt: text('expires_at').notNull(),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

/**
 * Sign-in attempts, for rate limiting per account and per address across every app
 * process that shares the database. Old rows are pruned as new ones are written.
 */
export const signInAttempts = sqliteTable(
  'sign_in_attempts',
  {
    id: integer('id').primaryKey(),
    at: text('at').notNull(),
    /** The name as tried, lower-cased (it need not be a user). */
    userName: text('user_name').notNull(),
    address: text('address').notNull(),
    succeeded: integer('succeeded', { mode: 'boolean' }).notNull(),
  },
  (t) => [index('sign_in_attempts_user_idx').on(t.userName, t.at), index('sign_in_attempts_address_idx').on(t.address, t.at)],
);

/**
 * A saved estimate: an immutable snapshot of subject, model, the exact sales used and the
 * Result JSON, so a worksheet can be reproduced after the sales change.
 */
export const estimates = sqliteTable(
  'estimates',
  {
    id: integer('id').primaryKey(),
    marketId: integer('market_id')
      .notNull()
      .references(() => markets.id, { onDelete: 'restrict' }),
    createdAt: text('created_at').notNull().default(now),
    createdBy: text('created_by').notNull(),
    appVersion: text('app_version').notNull(),
    /** The market's name, area unit and currency as they were when the estimate was saved. */
    marketJson: text('market_json').notNull().default('{}'),
    subjectJson: text('subject_json').notNull(),
    modelJson: text('model_json').notNull(),
    salesJson: text('sales_json').notNull(),
    resultJson: text('result_json').notNull(),
  },
  (t) => [index('estimates_market_idx').on(t.marketId, t.createdAt)],
);

export type MarketRow = typeof markets.$inferSelect;
export type SaleRow = typeof sales.$inferSelect;
export type NewSaleRow = typeof sales.$inferInsert;
export type SaleChangeRow = typeof saleChanges.$inferSelect;
export type ImportBatchRow = typeof importBatches.$inferSelect;
export type UserRow = typeof users.$inferSelect;
export type SessionRow = typeof sessions.$inferSelect;
export type SignInAttemptRow = typeof signInAttempts.$inferSelect;
export type EstimateRow = typeof estimates.$inferSelect;
