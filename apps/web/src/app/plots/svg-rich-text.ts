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
