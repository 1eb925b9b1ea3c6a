import { describe, expect, it } from 'vitest';
import { worksheetCsv } from '../../src/worksheet/worksheet-csv.js';
import { worksheetDownload } from '../../src/worksheet/worksheet-download.js';
import { buildWorksheet } from '../../src/worksheet/worksheet-model.js';
import { worksheetPdf } from '../../src/worksheet/worksheet-pdf.js';
import { savedEstimate } from './demo-snapshot.js';

describe('worksheet download', () => {
  const saved = savedEstimate({ id: 42 });
  it('PDF: the worksheet bytes, application/pdf, a file name with the estimate id', async () => {
    const d = await worksheetDownload(saved, 'pdf');
    expect(d.contentType).toBe('application/pdf');
    expect(d.fileName).toBe('estimate-42-worksheet.pdf');
    expect(d.body.equals(await worksheetPdf(buildWorksheet(saved)))).toBe(true);
  });
  it('CSV: UTF-8 text with its BOM, text/csv', async () => {
    const d = await worksheetDownload(saved, 'csv');
    expect(d.contentType).toBe('text/csv; charset=utf-8');
    expect(d.fileName).toBe('estimate-42-worksheet.csv');
    expect([...d.body.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    expect(d.body.toString('utf8')).toBe(worksheetCsv(buildWorksheet(saved)));
  });
});
