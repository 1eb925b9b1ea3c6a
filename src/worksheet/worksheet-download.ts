/**
 * A saved estimate's worksheet as a download: the bytes, the media type and a file name,
 * so the web routes (`GET /estimates/:id/worksheet.pdf|.csv`) and the command line agree.
 */
import type { SavedEstimate } from '../domain/saved-estimate.js';
import { worksheetCsv } from './worksheet-csv.js';
import { buildWorksheet } from './worksheet-model.js';
import { worksheetPdf } from './worksheet-pdf.js';

export type WorksheetFormat = 'pdf' | 'csv';

export interface WorksheetDownload {
  body: Buffer;
  contentType: string;
  fileName: string;
}

export async function worksheetDownload(saved: SavedEstimate, format: WorksheetFormat): Promise<WorksheetDownload> {
  const worksheet = buildWorksheet(saved);
  const fileName = `estimate-${saved.id}-worksheet.${format}`;
  if (format === 'pdf') return { body: await worksheetPdf(worksheet), contentType: 'application/pdf', fileName };
  return { body: Buffer.from(worksheetCsv(worksheet), 'utf8'), contentType: 'text/csv; charset=utf-8', fileName };
}
