/**
 * Page geometry, type sizes and colours of the worksheet PDF, and the cursor that flows
 * content down A4 portrait pages: it starts a new page when a piece does not fit.
 */
import type PDFDocument from 'pdfkit';
import { wrapText } from './pdf-text.js';

export type Doc = InstanceType<typeof PDFDocument>;

/** A4 portrait in points (1/72 inch). */
export const PAGE = { width: 595.28, height: 841.89, left: 42, right: 42, top: 44, bottom: 64 } as const;

export const FONT = { regular: 'Helvetica', bold: 'Helvetica-Bold', italic: 'Helvetica-Oblique' } as const;

export const SIZE = { title: 18, subtitle: 12, heading: 12, subheading: 9.5, body: 8.5, table: 7, small: 6.5 } as const;

export const COLOR = {
  text: '#1a1a1a',
  muted: '#555555',
  rule: '#9aa3ad',
  grid: '#e3e6ea',
  stripe: '#f3f5f7',
  headerFill: '#e6eaef',
  cautionFill: '#fff6e0',
  cautionBorder: '#c98a00',
  point: '#3d5a80',
  flagged: '#c0392b',
  subject: '#d35400',
  prediction: '#c9d6e3',
  confidence: '#6f8fb0',
} as const;

export class PdfCursor {
  y: number = PAGE.top;
  readonly left = PAGE.left;
  readonly width = PAGE.width - PAGE.left - PAGE.right;
  readonly bottom = PAGE.height - PAGE.bottom;

  constructor(
    readonly doc: Doc,
    /** Turns text into what the standard fonts can show. */
    readonly clean: (text: string) => string,
  ) {}

  get room(): number {
    return this.bottom - this.y;
  }

  newPage(): void {
    this.doc.addPage();
    this.y = PAGE.top;
  }

  /** Starts a new page unless `height` points still fit; true when it started one. */
  ensure(height: number): boolean {
    if (this.y + height <= this.bottom || this.y === PAGE.top) return false;
    this.newPage();
    return true;
  }

  /** Widths already measured, per font and size: tables measure the same text again and again. */
  private readonly widths = new Map<string, Map<string, number>>();
  private currentWidths = new Map<string, number>();

  /** Sets font and size for text and measuring. */
  font(font: string, size: number): void {
    this.doc.font(font).fontSize(size);
    const key = `${font}|${size}`;
    let cache = this.widths.get(key);
    if (!cache) this.widths.set(key, (cache = new Map()));
    this.currentWidths = cache;
  }

  use(font: string, size: number, color: string = COLOR.text): void {
    this.font(font, size);
    this.doc.fillColor(color);
  }

  /** Width of text in the current font and size, in points. */
  widthOfString(text: string): number {
    let w = this.currentWidths.get(text);
    if (w === undefined) {
      w = this.doc.widthOfString(text);
      this.currentWidths.set(text, w);
    }
    return w;
  }

  /** Wraps already-cleaned text in the current font. */
  lines(text: string, width: number): string[] {
    return wrapText(this, text, width);
  }

  /** Writes one line with no wrapping and no page break, aligned inside `width`. */
  line(text: string, x: number, y: number, width: number, align: 'left' | 'right' | 'center' = 'left'): void {
    let dx = 0;
    if (align !== 'left') {
      const w = this.widthOfString(text);
      dx = align === 'right' ? width - w : (width - w) / 2;
    }
    this.doc.text(text, x + dx, y, { lineBreak: false });
  }

  /** A wrapped paragraph at the cursor, breaking pages between lines. */
  paragraph(text: string, font: string, size: number, options: { color?: string; indent?: number; gapAfter?: number } = {}): void {
    this.use(font, size, options.color);
    const indent = options.indent ?? 0;
    const lineHeight = size * 1.3;
    for (const l of this.lines(this.clean(text), this.width - indent)) {
      this.ensure(lineHeight);
      this.use(font, size, options.color);
      this.line(l, this.left + indent, this.y, this.width - indent);
      this.y += lineHeight;
    }
    this.y += options.gapAfter ?? size * 0.6;
  }

  rule(y: number, color: string = COLOR.rule, width = 0.6): void {
    this.doc.save().lineWidth(width).strokeColor(color).moveTo(this.left, y).lineTo(this.left + this.width, y).stroke().restore();
  }
}
