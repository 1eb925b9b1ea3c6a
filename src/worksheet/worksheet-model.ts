/**
 * A saved estimate → the worksheet as plain data: a title block, the caution, and sections
 * of labelled fields, tables, paragraphs and pictures, every figure already formatted.
 * This is the single source the PDF and CSV writers render, so the two always agree.
 * Built only from the snapshot (never from the live sales), so the same saved estimate
 * gives the same worksheet every time.
 */
import { CAUTION_TEXT, CAUTION_TITLE } from '../domain/cautions.js';
import { estimateCharts, type Chart, type IntervalPicture } from '../domain/estimate-charts.js';
import { areaLabel, formatTime } from '../domain/format.js';
import type { SavedEstimate } from '../domain/saved-estimate.js';
import { worksheetSections } from './worksheet-sections.js';
import { textCell, type Cell } from './worksheet-cells.js';
import { chartTicks, intervalTicks } from './worksheet-ticks.js';

export type { Cell } from './worksheet-cells.js';

export interface Column {
  heading: string;
  /** Unit of the column's numbers for the CSV heading (currency code, area unit, %). */
  unit?: string;
  align: 'left' | 'right';
  /** Long text that may wrap onto several lines in the PDF (addresses, reasons, messages). */
  wrap?: boolean;
}

export interface WorksheetTable {
  id: string;
  heading: string;
  columns: Column[];
  rows: Cell[][];
  /** What the table shows and how to read it, printed under it. */
  note?: string;
  /** Printed instead of an empty table. */
  empty?: string;
}

/** One labelled figure; two cells are a range (an interval) printed as "low to high". */
export interface Field {
  label: string;
  cells: Cell[];
}

export interface ChartView {
  chart: Chart;
  xTicks: string[];
  yTicks: string[];
}

export interface IntervalView {
  picture: IntervalPicture;
  ticks: string[];
  valueText: string;
  confidenceText: [string, string];
  predictionText: [string, string];
}

export type Block =
  | { kind: 'fields'; id: string; heading?: string; fields: Field[] }
  | { kind: 'table'; table: WorksheetTable }
  | { kind: 'paragraphs'; id: string; paragraphs: { heading?: string; text: string }[] }
  | { kind: 'charts'; charts: ChartView[] }
  | { kind: 'interval'; view: IntervalView };

export interface WorksheetSection {
  id: string;
  heading: string;
  blocks: Block[];
}

export interface Worksheet {
  title: string;
  estimateId: number;
  /** ISO timestamp of saving: the PDF's creation date, so the bytes do not depend on the clock. */
  createdAt: string;
  createdBy: string;
  appVersion: string;
  subjectAddress: string;
  currency: string;
  titleFields: Field[];
  caution: { title: string; text: string; line: string };
  sections: WorksheetSection[];
}

/** The caution repeated in every page's footer (DESIGN.md "The cautions"), short enough for two lines. */
export const CAUTION_LINE =
  'A statistical indication from recorded sales, not an appraisal. It does not replace the judgement of a licensed or certified appraiser; ' +
  'the standards and laws where the property lies govern (in the US, USPAP and state licensing law). Verify every sale and characteristic.';

export function buildWorksheet(saved: SavedEstimate): Worksheet {
  const { market, subject, result } = saved;
  const unit = areaLabel(market.areaUnit);
  const { charts, interval } = estimateCharts(result, saved.sales, subject, unit);
  const titleFields: Field[] = [
    { label: 'Market', cells: [textCell(market.name)] },
    { label: 'Subject', cells: [textCell(subject.address)] },
    { label: 'Effective date', cells: [textCell(subject.effectiveDate)] },
    { label: 'Prepared by', cells: [textCell(saved.createdBy)] },
    { label: 'Estimate saved', cells: [textCell(formatTime(saved.createdAt))] },
    { label: 'Generated', cells: [textCell('from the saved snapshot: every download of this estimate gives this same worksheet')] },
    { label: 'App version', cells: [textCell(`compfit ${saved.appVersion}`)] },
    { label: 'Estimate id', cells: [{ text: String(saved.id), value: saved.id }] },
    { label: 'Currency and area unit', cells: [textCell(`${market.currency}; areas in ${unit}`)] },
  ];
  const intervalView: IntervalView = intervalTicks(interval, market.currency);
  const chartViews: ChartView[] = charts.map((c) => chartTicks(c, market.currency, result.transform));
  return {
    title: 'Estimate worksheet',
    estimateId: saved.id,
    createdAt: saved.createdAt,
    createdBy: saved.createdBy,
    appVersion: saved.appVersion,
    subjectAddress: subject.address,
    currency: market.currency,
    titleFields,
    caution: { title: CAUTION_TITLE, text: CAUTION_TEXT, line: CAUTION_LINE },
    sections: worksheetSections(saved, intervalView, chartViews),
  };
}
