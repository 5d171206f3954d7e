import { textRuns } from '@gapwise/contracts';

const SVG_NS = 'http://www.w3.org/2000/svg';
/** Subscript size relative to the text (as `gw-rich-text` and the PDF report). */
export const SUB_SCALE = 0.72;
/** How far a subscript drops, in ems of the subscript. */
const SUB_DROP_EM = 0.35;

/**
 * Writes `text` into an SVG `<text>` with true subscripts: each `_X` / `_{…}` run becomes a
 * smaller `<tspan>` lowered by `dy`, and the next plain run climbs back to the baseline. Only
 * presentation attributes are used (no CSS, no `baseline-shift`), so the exported SVG and PNG
 * draw the same in any viewer. The element's text content reads without the markup (`2|HAB|`).
 */
export function setSvgRichText(el: SVGTextElement, text: string): void {
  el.textContent = '';
  let lowered = false;
  for (const run of textRuns(text)) {
    const span = el.ownerDocument.createElementNS(SVG_NS, 'tspan');
    span.textContent = run.text;
    if (run.sub) {
      span.setAttribute('class', 'sub');
      span.setAttribute('font-size', `${SUB_SCALE}em`);
      if (!lowered) span.setAttribute('dy', `${SUB_DROP_EM}em`);
      lowered = true;
    } else if (lowered) {
      span.setAttribute('dy', `${(-SUB_DROP_EM * SUB_SCALE).toFixed(3)}em`);
      lowered = false;
    }
    el.appendChild(span);
  }
}

let context: OffscreenCanvasRenderingContext2D | null | undefined;

/**
 * The width of `text` as `setSvgRichText` draws it in Inter at `sizePx` and `weight`, subscripts
 * at their smaller size, measured on an offscreen canvas: no layout of the page is forced, so a
 * plot can measure its labels on every keystroke. Null where no canvas exists (unit tests).
 */
export function svgRichTextWidth(text: string, sizePx: number, weight = 400): number | null {
  if (context === undefined) {
    context =
      typeof OffscreenCanvas === 'function' ? new OffscreenCanvas(1, 1).getContext('2d') : null;
  }
  if (!context) return null;
  let width = 0;
  for (const run of textRuns(text)) {
    const size = run.sub ? sizePx * SUB_SCALE : sizePx;
    context.font = `${weight} ${size}px Inter, system-ui, sans-serif`;
    width += context.measureText(run.text).width;
  }
  return width;
}
