/**
 * A small inline text layout for the report: word wrapping over runs that switch weight and
 * drop to subscripts. `H_AB` and `τ_L` print with a true subscript (the markup of `textRuns` in
 * `@gapwise/contracts`, the rule the web page draws by). Everything else is plain Unicode, which
 * the embedded Inter covers.
 */
import type PDFDocument from 'pdfkit';
import { textRuns } from '@gapwise/contracts';
import { FONT_REGULAR, FONT_SEMIBOLD } from './fonts';

type Doc = InstanceType<typeof PDFDocument>;

export interface Run {
  readonly text: string;
  readonly bold: boolean;
  readonly sub: boolean;
}

export interface TextStyle {
  readonly size: number;
  readonly bold?: boolean;
  readonly color?: string;
  /** Line height as a multiple of the size; default 1.3. */
  readonly leading?: number;
  readonly align?: 'left' | 'right' | 'center';
}

const SUB_SCALE = 0.72;

/** Splits `text` into runs; `_X` / `_{X}` become subscripts (`textRuns`, as on the web page). */
export function parseRuns(text: string, bold = false): Run[] {
  return textRuns(text).map((r) => ({ text: r.text, bold, sub: r.sub }));
}

/** Sets the document's font for a run. */
function useFont(doc: Doc, run: Run, size: number): void {
  doc.font(run.bold ? FONT_SEMIBOLD : FONT_REGULAR).fontSize(run.sub ? size * SUB_SCALE : size);
}

function runWidth(doc: Doc, run: Run, size: number): number {
  useFont(doc, run, size);
  return doc.widthOfString(run.text);
}

interface Piece {
  readonly run: Run;
  readonly width: number;
}

/** A laid-out line: pieces with their widths. */
type Line = Piece[];

/** Breaks runs into lines no wider than `width` (words longer than a line are split by char). */
export function layoutRuns(doc: Doc, runs: readonly Run[], width: number, size: number): Line[] {
  // Tokens: words and single spaces, each keeping its run's style; newlines force a break.
  const tokens: Array<Piece | 'newline'> = [];
  for (const run of runs) {
    for (const part of run.text.split(/(\s)/)) {
      if (part === '') continue;
      if (part === '\n') tokens.push('newline');
      else
        tokens.push({
          run: { ...run, text: part },
          width: runWidth(doc, { ...run, text: part }, size),
        });
    }
  }
  const lines: Line[] = [];
  let line: Piece[] = [];
  let used = 0;
  // A "word" may span several runs (H + AB); keep such pieces together.
  let i = 0;
  const flush = () => {
    while (line.length > 0 && /^\s$/.test(line[line.length - 1].run.text)) line.pop();
    lines.push(line);
    line = [];
    used = 0;
  };
  while (i < tokens.length) {
    const t = tokens[i];
    if (t === 'newline') {
      flush();
      i++;
      continue;
    }
    if (/^\s$/.test(t.run.text)) {
      if (line.length > 0) {
        line.push(t);
        used += t.width;
      }
      i++;
      continue;
    }
    const word: Piece[] = [];
    let j = i;
    while (j < tokens.length) {
      const tj = tokens[j];
      if (tj === 'newline' || /^\s$/.test(tj.run.text)) break;
      word.push(tj);
      j++;
    }
    const wordWidth = word.reduce((s, p) => s + p.width, 0);
    if (used + wordWidth > width && line.length > 0) flush();
    if (wordWidth > width) {
      // Split an over-long word (a hash, a URL) character by character.
      for (const piece of word) {
        for (const ch of Array.from(piece.run.text)) {
          const p = {
            run: { ...piece.run, text: ch },
            width: runWidth(doc, { ...piece.run, text: ch }, size),
          };
          if (used + p.width > width && line.length > 0) flush();
          line.push(p);
          used += p.width;
        }
      }
    } else {
      line.push(...word);
      used += wordWidth;
    }
    i = j;
  }
  if (line.length > 0 || lines.length === 0) flush();
  return lines;
}

/** Height that `text` takes at `width`. */
export function measureRich(doc: Doc, text: string, width: number, style: TextStyle): number {
  const lines = layoutRuns(doc, parseRuns(text, style.bold), width, style.size);
  return lines.length * style.size * (style.leading ?? 1.3);
}

/** Draws `text` wrapped to `width` from (x, y); returns the height used. */
export function drawRich(
  doc: Doc,
  text: string,
  x: number,
  y: number,
  width: number,
  style: TextStyle,
): number {
  const size = style.size;
  const lineHeight = size * (style.leading ?? 1.3);
  const lines = layoutRuns(doc, parseRuns(text, style.bold), width, size);
  doc.fillColor(style.color ?? '#1f2328');
  let top = y;
  for (const line of lines) {
    const lineWidth = line.reduce((s, p) => s + p.width, 0);
    let cx = x;
    if (style.align === 'right') cx = x + width - lineWidth;
    else if (style.align === 'center') cx = x + (width - lineWidth) / 2;
    // Baseline of the line; pdfkit places text by its top, at ascender below y.
    const pad = (lineHeight - size) / 2;
    for (const piece of line) {
      useFont(doc, piece.run, size);
      const ascender = (doc as unknown as { _font: { ascender: number } })._font.ascender / 1000;
      const baseline = top + pad + ascender * size;
      const pieceSize = piece.run.sub ? size * SUB_SCALE : size;
      const drop = piece.run.sub ? size * 0.2 : 0;
      doc.text(piece.run.text, cx, baseline + drop - ascender * pieceSize, { lineBreak: false });
      cx += piece.width;
    }
    top += lineHeight;
  }
  return top - y;
}
