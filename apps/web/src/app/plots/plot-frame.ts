import { plainText } from '@gapwise/contracts';
import { axisBottom, axisLeft, scaleLinear, select, type ScaleLinear, type Selection } from 'd3';
import { setSvgRichText } from './svg-rich-text';

export interface FrameOptions {
  readonly width: number;
  readonly height: number;
  readonly margin: {
    readonly top: number;
    readonly right: number;
    readonly bottom: number;
    readonly left: number;
  };
  readonly xDomain: readonly [number, number];
  readonly yDomain: readonly [number, number];
  /** Axis labels may carry subscript markup (`−ΔG°_CS / eV`). */
  readonly xLabel: string;
  readonly yLabel: string;
  /** Read by assistive technology; markup is dropped (`|H_AB|` → `|HAB|`). */
  readonly title: string;
}

export interface Frame {
  readonly svg: Selection<SVGSVGElement, unknown, null, undefined>;
  /** Plot area, translated by the margins and clipped to them. */
  readonly plot: Selection<SVGGElement, unknown, null, undefined>;
  /**
   * Overlay group above the plot, not clipped: labels and arrows (exported with the plot) and the
   * hover read-out of `attachHover` (class `hover`, left out of exports).
   */
  readonly overlay: Selection<SVGGElement, unknown, null, undefined>;
  readonly x: ScaleLinear<number, number>;
  readonly y: ScaleLinear<number, number>;
  readonly innerWidth: number;
  readonly innerHeight: number;
}

/**
 * Clears `svgEl` and draws the frame every plot of Gapwise shares: title for assistive
 * technology, axes with quantity and unit, arrowhead markers, a clip path. Text inherits Inter
 * (d3 axes would otherwise force `sans-serif`).
 */
export function drawFrame(svgEl: SVGSVGElement, id: string, o: FrameOptions): Frame {
  const innerWidth = o.width - o.margin.left - o.margin.right;
  const innerHeight = o.height - o.margin.top - o.margin.bottom;
  const svg = select(svgEl);
  svg.selectAll('*').remove();
  svg
    .attr('viewBox', `0 0 ${o.width} ${o.height}`)
    .attr('xmlns', 'http://www.w3.org/2000/svg')
    .attr('font-family', 'Inter, system-ui, sans-serif')
    .attr('font-size', 12)
    .attr('role', 'img');
  svg.append('title').text(plainText(o.title));
  const defs = svg.append('defs');
  defs
    .append('clipPath')
    .attr('id', `${id}-clip`)
    .append('rect')
    .attr('width', innerWidth)
    .attr('height', innerHeight);
  for (const [name, colour] of [
    ['arrow', '#1f2b2b'],
    ['arrow-accent', '#9a6400'],
  ] as const) {
    defs
      .append('marker')
      .attr('id', `${id}-${name}`)
      .attr('viewBox', '0 0 10 10')
      .attr('refX', 9)
      .attr('refY', 5)
      .attr('markerWidth', 7)
      .attr('markerHeight', 7)
      .attr('orient', 'auto-start-reverse')
      .append('path')
      .attr('d', 'M0,0L10,5L0,10z')
      .attr('fill', colour);
  }
  svg.append('rect').attr('width', o.width).attr('height', o.height).attr('fill', '#ffffff');

  const x = scaleLinear()
    .domain(o.xDomain as [number, number])
    .range([0, innerWidth]);
  const y = scaleLinear()
    .domain(o.yDomain as [number, number])
    .range([innerHeight, 0]);
  const root = svg.append('g').attr('transform', `translate(${o.margin.left},${o.margin.top})`);

  const xAxis = root
    .append('g')
    .attr('class', 'axis x')
    .attr('transform', `translate(0,${innerHeight})`)
    .call(axisBottom(x).ticks(7).tickSizeOuter(0));
  const yAxis = root
    .append('g')
    .attr('class', 'axis y')
    .call(axisLeft(y).ticks(6).tickSizeOuter(0));
  for (const axis of [xAxis, yAxis]) {
    axis.attr('font-family', null).attr('font-size', 11);
    axis.selectAll('text').attr('fill', '#3c4747');
    axis.selectAll('line,path').attr('stroke', '#7a8a8a');
  }
  // Light grid for reading values.
  root
    .append('g')
    .attr('class', 'grid')
    .selectAll('line')
    .data(y.ticks(6))
    .join('line')
    .attr('x1', 0)
    .attr('x2', innerWidth)
    .attr('y1', (d) => y(d))
    .attr('y2', (d) => y(d))
    .attr('stroke', '#e3eaea');

  const xLabel = root
    .append('text')
    .attr('class', 'axis-label')
    .attr('x', innerWidth / 2)
    .attr('y', innerHeight + 36)
    .attr('text-anchor', 'middle')
    .attr('fill', '#1f2b2b');
  setSvgRichText(xLabel.node()!, o.xLabel);
  const yLabel = root
    .append('text')
    .attr('class', 'axis-label')
    .attr('transform', `translate(${-o.margin.left + 14},${innerHeight / 2}) rotate(-90)`)
    .attr('text-anchor', 'middle')
    .attr('fill', '#1f2b2b');
  setSvgRichText(yLabel.node()!, o.yLabel);

  const plot = root.append('g').attr('clip-path', `url(#${id}-clip)`);
  const overlay = root.append('g').attr('class', 'overlay');
  return { svg, plot, overlay, x, y, innerWidth, innerHeight };
}

/** Hover read-out: a vertical rule and a text box that follows the pointer. */
export function attachHover(
  frame: Frame,
  describe: (xValue: number) => { x: number; lines: string[] } | null,
): void {
  const { overlay, innerWidth, innerHeight, x } = frame;
  const rule = overlay
    .append('line')
    .attr('class', 'hover')
    .attr('y1', 0)
    .attr('y2', innerHeight)
    .attr('stroke', '#5d6b6b')
    .attr('stroke-dasharray', '2 3')
    .style('display', 'none');
  const box = overlay
    .append('g')
    .attr('class', 'hover')
    .style('display', 'none')
    .attr('pointer-events', 'none');
  const bg = box
    .append('rect')
    .attr('fill', 'rgba(255,255,255,0.94)')
    .attr('stroke', '#9aabab')
    .attr('rx', 4);
  const text = box.append('text').attr('fill', '#1f2b2b').attr('font-size', 11);
  overlay
    .append('rect')
    .attr('class', 'hover')
    .attr('width', innerWidth)
    .attr('height', innerHeight)
    .attr('fill', 'transparent')
    .on('pointermove', (event: PointerEvent) => {
      const [px] = pointerIn(event, overlay.node()!);
      const d = describe(x.invert(px));
      if (!d) return;
      const cx = x(d.x);
      rule.attr('x1', cx).attr('x2', cx).style('display', null);
      text
        .selectAll('tspan')
        .data(d.lines)
        .join('tspan')
        .attr('x', 8)
        .attr('dy', (_, i) => (i === 0 ? 15 : 14))
        .text((l) => l);
      const w = Math.max(...d.lines.map((l) => l.length)) * 6.2 + 16;
      const h = d.lines.length * 14 + 10;
      bg.attr('width', w).attr('height', h);
      const bx = cx + 10 + w > innerWidth ? cx - w - 10 : cx + 10;
      box.attr('transform', `translate(${bx},6)`).style('display', null);
    })
    .on('pointerleave', () => {
      rule.style('display', 'none');
      box.style('display', 'none');
    });
}

function pointerIn(event: PointerEvent, node: SVGGElement): [number, number] {
  const ctm = node.getScreenCTM();
  if (!ctm) return [0, 0];
  const p = new DOMPoint(event.clientX, event.clientY).matrixTransform(ctm.inverse());
  return [p.x, p.y];
}
