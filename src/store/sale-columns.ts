/**
 * Maps between a domain Sale and a row of the `sales` table. Characteristic keys keep
 * their CSV spelling in the domain and become camel-case columns here.
 */
import { CHARACTERISTICS, type Characteristic, type Sale } from '../domain/sale.js';
import type { NewSaleRow, SaleRow } from './schema.js';

/** A sale as stored: the domain Sale plus its database key and times. */
export interface StoredSale extends Sale {
  /** Internal integer key, used in URLs; `id` stays the user's reference. */
  key: number;
  marketId: number;
  createdAt: string;
  updatedAt: string;
}

export const CHARACTERISTIC_COLUMN = {
  living_area: 'livingArea',
  year_built: 'yearBuilt',
  rooms: 'rooms',
  bedrooms: 'bedrooms',
  bathrooms: 'bathrooms',
  lot_area: 'lotArea',
  garage_spaces: 'garageSpaces',
} as const satisfies Record<Characteristic, keyof SaleRow>;

export function rowToSale(row: SaleRow): StoredSale {
  const characteristics: Sale['characteristics'] = {};
  for (const c of CHARACTERISTICS) {
    const v = row[CHARACTERISTIC_COLUMN[c]];
    if (v !== null && v !== undefined) characteristics[c] = v;
  }
  return {
    key: row.id,
    marketId: row.marketId,
    id: row.ref,
    address: row.address,
    saleDate: row.saleDate,
    salePrice: row.salePrice,
    characteristics,
    ...(row.notes ? { notes: row.notes } : {}),
    ...(row.verification ? { verification: row.verification } : {}),
    included: row.included,
    ...(!row.included ? { excludedReason: row.excludedReason ?? '' } : {}),
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
  };
}

/** The columns of a sale apart from keys and times; `ref` must already be settled. */
export function saleToColumns(sale: Sale): Omit<NewSaleRow, 'id' | 'marketId' | 'createdAt' | 'updatedAt' | 'importBatchId'> {
  const c = sale.characteristics;
  return {
    ref: sale.id,
    address: sale.address,
    saleDate: sale.saleDate,
    salePrice: sale.salePrice,
    livingArea: c.living_area ?? null,
    yearBuilt: c.year_built ?? null,
    rooms: c.rooms ?? null,
    bedrooms: c.bedrooms ?? null,
    bathrooms: c.bathrooms ?? null,
    lotArea: c.lot_area ?? null,
    garageSpaces: c.garage_spaces ?? null,
    verification: sale.verification ?? null,
    notes: sale.notes ?? null,
    included: sale.included,
    excludedReason: sale.included ? null : (sale.excludedReason ?? null),
  };
}

/** The domain part of a stored sale, as written to the change history. */
export function toDomainSale(s: StoredSale | Sale): Sale {
  return {
    id: s.id,
    address: s.address,
    saleDate: s.saleDate,
    salePrice: s.salePrice,
    characteristics: { ...s.characteristics },
    ...(s.notes ? { notes: s.notes } : {}),
    ...(s.verification ? { verification: s.verification } : {}),
    included: s.included,
    ...(!s.included ? { excludedReason: s.excludedReason } : {}),
  };
}
