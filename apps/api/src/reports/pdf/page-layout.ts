/**
 * Page geometry, colours and the vertical cursor of the report. pdfkit's own text flow is not
 * used for layout (it adds pages on its own); every block measures itself and asks for room.
 */
import type PDFDocument from 'pdfkit';
import { drawRich, measureRich, type TextStyle } from './rich-text';

export type Doc = InstanceType<typeof PDFDocument>;

/** Palette of PRODUCT.md: deep teal primary, warm amber accent, diabats blue/orange. */
export const COLORS = {
  text: '#1f2328',
  muted: '#57606a',
  rule: '#d0d7de',
  zebra: '#f4f7f7',
  teal: '#00695c',
  tealLight: '#e0f2f1',
  amber: '#b26a00',
  amberLight: '#fff4e0',
  reactant: '#1f6fb2',
  product: '#c4561d',
  charcoal: '#3a3f44',
  danger: '#b3261e',
} as const;

export const PAGE = {
  size: 'A4' as const,
  margin: { top: 54, bottom: 62, left: 50, right: 50 },
};

export class Cursor {
  y: number;
  constructor(readonly doc: Doc) {
    this.y = doc.page.margins.top;
  }
  get left(): number {
    return this.doc.page.margins.left;
  }
  get width(): number {
    return this.doc.page.width - this.doc.page.margins.left - this.doc.page.margins.right;
  }
  get bottom(): number {
    return this.doc.page.height - this.doc.page.margins.bottom;
  }
  /** Starts a new page when fewer than `height` points are left. Returns whether it did. */
  need(height: number): boolean {
    if (this.y + height <= this.bottom) return false;
    this.doc.addPage();
    this.y = this.doc.page.margins.top;
    return true;
  }
  gap(points: number): void {
    this.y += points;
  }
  /** Wrapped text at the cursor; breaks the page before it when it does not fit. */
  text(text: string, style: TextStyle, indent = 0): void {
    const width = this.width - indent;
    const h = measureRich(this.doc, text, width, style);
    this.need(h);
    this.y += drawRich(this.doc, text, this.left + indent, this.y, width, style);
  }
  /** A section heading with a teal rule; keeps `keepWith` points of content on the same page. */
  heading(text: string, keepWith = 60): void {
    this.need(28 + keepWith);
    if (this.y > this.doc.page.margins.top + 1) this.y += 10;
    drawRich(this.doc, text, this.left, this.y, this.width, {
      size: 12.5,
      bold: true,
      color: COLORS.teal,
    });
    this.y += 19;
    this.doc
      .moveTo(this.left, this.y)
      .lineTo(this.left + this.width, this.y)
      .lineWidth(0.8)
      .strokeColor(COLORS.teal)
      .stroke();
    this.y += 8;
  }
  subheading(text: string, keepWith = 40): void {
    this.need(18 + keepWith);
    this.y += 4;
    this.y += drawRich(this.doc, text, this.left, this.y, this.width, { size: 10, bold: true });
    this.y += 2;
  }
}

export interface Column {
  readonly header: string;
  /** Fraction of the table width. */
  readonly width: number;
  readonly align?: 'left' | 'right';
}

/**
 * A table with a repeated header row, zebra rows and cells that wrap; a row never splits across
 * pages. `cells[r][c]` are rich-text strings.
 */
export function drawTable(
  cursor: Cursor,
  columns: readonly Column[],
  rows: ReadonlyArray<readonly string[]>,
  options: { size?: number; rowStyles?: ReadonlyArray<'normal' | 'bold'> } = {},
): void {
  const doc = cursor.doc;
  const size = options.size ?? 8.5;
  const padX = 4;
  const padY = 3.5;
  const total = cursor.width;
  const widths = columns.map((c) => c.width * total);
  const xs = widths.map((_, i) => cursor.left + widths.slice(0, i).reduce((s, w) => s + w, 0));
  const cellStyle = (bold: boolean, align?: 'left' | 'right'): TextStyle => ({
    size,
    bold,
    align,
    leading: 1.25,
  });
  const rowHeight = (cells: readonly string[], bold: boolean) =>
    Math.max(
      ...cells.map((c, i) =>
        measureRich(doc, c, widths[i] - 2 * padX, cellStyle(bold, columns[i].align)),
      ),
    ) +
    2 * padY;
  const drawRow = (
    cells: readonly string[],
    y: number,
    h: number,
    header: boolean,
    bold: boolean,
    zebra: boolean,
  ) => {
    if (header) doc.rect(cursor.left, y, total, h).fill(COLORS.tealLight);
    else if (zebra) doc.rect(cursor.left, y, total, h).fill(COLORS.zebra);
    cells.forEach((c, i) => {
      drawRich(doc, c, xs[i] + padX, y + padY, widths[i] - 2 * padX, {
        ...cellStyle(header || bold, columns[i].align),
        color: header ? COLORS.teal : COLORS.text,
      });
    });
    doc
      .moveTo(cursor.left, y + h)
      .lineTo(cursor.left + total, y + h)
      .lineWidth(0.4)
      .strokeColor(COLORS.rule)
      .stroke();
  };
  const headerCells = columns.map((c) => c.header);
  const headerHeight = rowHeight(headerCells, true);
  const firstRow = rows.length > 0 ? rowHeight(rows[0], options.rowStyles?.[0] === 'bold') : 0;
  cursor.need(headerHeight + firstRow);
  drawRow(headerCells, cursor.y, headerHeight, true, true, false);
  cursor.y += headerHeight;
  rows.forEach((cells, r) => {
    const bold = options.rowStyles?.[r] === 'bold';
    const h = rowHeight(cells, bold);
    if (cursor.need(h)) {
      drawRow(headerCells, cursor.y, headerHeight, true, true, false);
      cursor.y += headerHeight;
    }
    drawRow(cells, cursor.y, h, false, bold, r % 2 === 1);
    cursor.y += h;
  });
}

/** A tinted box with a coloured left bar around wrapped text (notes, cautions). */
export function drawNote(
  cursor: Cursor,
  title: string,
  body: string,
  tint: string,
  bar: string,
): void {
  const doc = cursor.doc;
  const inner = cursor.width - 20;
  const titleH = measureRich(doc, title, inner, { size: 9.5, bold: true });
  const bodyH = measureRich(doc, body, inner, { size: 9 });
  const h = titleH + bodyH + 16;
  cursor.need(h);
  doc.rect(cursor.left, cursor.y, cursor.width, h).fill(tint);
  doc.rect(cursor.left, cursor.y, 3, h).fill(bar);
  drawRich(doc, title, cursor.left + 12, cursor.y + 7, inner, {
    size: 9.5,
    bold: true,
    color: bar,
  });
  drawRich(doc, body, cursor.left + 12, cursor.y + 7 + titleH, inner, { size: 9 });
  cursor.y += h;
}
