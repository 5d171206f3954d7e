import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  computed,
  effect,
  input,
  output,
  viewChild,
} from '@angular/core';
import {
  drivingForceCurves,
  type DrivingForceGeometry,
  type DrivingForceInputs,
} from '@gapwise/plots';
import { line } from 'd3';
import { formatFixed, formatSignificant } from '../../units/number-format';
import { PlotExport } from '../plot-export/plot-export';
import { attachHover, drawFrame } from '../plot-frame';

const W = 600;
const H = 360;
const MARGIN = { top: 16, right: 24, bottom: 48, left: 62 };

/** log10 k against −ΔG°: classical Marcus and MLJ, inverted region shaded, the pair marked. */
@Component({
  selector: 'gw-driving-force-plot',
  imports: [PlotExport],
  template: `
    <figure class="plot">
      <figcaption>
        <span class="title">Rate against driving force</span>
        <span class="spacer"></span>
        <gw-plot-export
          [svg]="svgEl()"
          [filename]="filename()"
          what="the rate against driving force"
        />
      </figcaption>
      <svg #svg width="100%" preserveAspectRatio="xMidYMid meet"></svg>
      @if (geometry(); as g) {
        <p class="legend">
          <span class="key marcus">━━ classical Marcus</span>
          @if (g.hasMlj) {
            <span class="key mlj">- - - Marcus–Levich–Jortner</span>
          }
          <span class="key">◆ this pair</span>
          <span class="key">shaded: inverted region (−ΔG° &gt; λ)</span>
        </p>
        @if (!g.hasMlj) {
          <p class="note">Give ħω and both λᵢ and λₒ to add the Marcus–Levich–Jortner curve.</p>
        }
      } @else {
        <p class="empty">Enter λ, |H<sub>AB</sub>| and the temperature to draw the curve.</p>
      }
    </figure>
  `,
  styleUrl: '../plot.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DrivingForcePlot {
  readonly inputs = input.required<DrivingForceInputs | null>();
  readonly filename = input('gapwise-rate-vs-driving-force');
  /** Name of the pair's own rate model, for the marker's label. */
  readonly model = input('');
  readonly redrawn = output<void>();

  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  protected readonly svgEl = computed(() => this.svgRef().nativeElement);
  protected readonly geometry = computed(() => {
    const i = this.inputs();
    return i ? drivingForceCurves(i) : null;
  });

  constructor() {
    effect(() => {
      const g = this.geometry();
      const svg = this.svgRef().nativeElement;
      if (g) this.draw(svg, g);
      else svg.replaceChildren();
      this.redrawn.emit();
    });
  }

  private draw(svgEl: SVGSVGElement, g: DrivingForceGeometry): void {
    const f = drawFrame(svgEl, 'driving', {
      width: W,
      height: H,
      margin: MARGIN,
      xDomain: g.domain,
      yDomain: g.log10kDomain,
      xLabel: 'Driving force −ΔG° / eV',
      yLabel: 'log₁₀(k / s⁻¹)',
      title: `log10 k against driving force; inverted region beyond −ΔG° = ${formatSignificant(g.invertedFrom, 3)} eV`,
    });
    const { plot, overlay, x, y } = f;
    const x0 = Math.max(x(g.invertedFrom), 0);
    plot
      .append('rect')
      .attr('class', 'inverted')
      .attr('x', x0)
      .attr('y', 0)
      .attr('width', Math.max(0, f.innerWidth - x0))
      .attr('height', f.innerHeight)
      .attr('fill', 'rgba(224,160,32,0.13)');
    overlay
      .append('text')
      .attr('x', x0 + 6)
      .attr('y', 14)
      .attr('fill', '#7a4f00')
      .attr('font-weight', 600)
      .text('inverted region');
    overlay
      .append('text')
      .attr('x', Math.max(4, x0 - 6))
      .attr('y', 14)
      .attr('fill', '#3c4747')
      .attr('text-anchor', 'end')
      .text('normal region');
    plot
      .append('line')
      .attr('x1', x(g.invertedFrom))
      .attr('x2', x(g.invertedFrom))
      .attr('y1', 0)
      .attr('y2', f.innerHeight)
      .attr('stroke', '#9a6400')
      .attr('stroke-dasharray', '2 3');

    type P = DrivingForceGeometry['points'][number];
    const curve = (key: 'marcus' | 'mlj') =>
      line<P>()
        .defined((p) => p[key] !== null && (p[key] as number) >= g.log10kDomain[0] - 5)
        .x((p) => x(p.minusDeltaG0))
        .y((p) => y(p[key] as number))(g.points as P[]);
    plot
      .append('path')
      .attr('class', 'curve marcus')
      .attr('d', curve('marcus'))
      .attr('fill', 'none')
      .attr('stroke', '#006a6a')
      .attr('stroke-width', 2.4);
    if (g.hasMlj) {
      plot
        .append('path')
        .attr('class', 'curve mlj')
        .attr('d', curve('mlj'))
        .attr('fill', 'none')
        .attr('stroke', '#9a6400')
        .attr('stroke-width', 2)
        .attr('stroke-dasharray', '6 4');
    }
    for (const m of g.measured) {
      plot
        .append('circle')
        .attr('cx', x(m.x))
        .attr('cy', y(m.y))
        .attr('r', 4)
        .attr('fill', 'none')
        .attr('stroke', '#1f2b2b');
    }
    if (g.pair) {
      const px = x(g.pair.x);
      const py = y(g.pair.y);
      overlay
        .append('path')
        .attr('class', 'pair-mark')
        .attr('d', `M${px},${py - 7}L${px + 7},${py}L${px},${py + 7}L${px - 7},${py}Z`)
        .attr('fill', '#e0a020')
        .attr('stroke', '#1f2b2b')
        .attr('stroke-width', 1.2);
      overlay
        .append('text')
        .attr('x', px + 10)
        .attr('y', py - 8)
        .attr('font-weight', 600)
        .attr('fill', '#1f2b2b')
        .text(`this pair${this.model() ? ` (${this.model()})` : ''}: ${formatFixed(g.pair.y, 2)}`);
    }
    attachHover(f, (xv) => {
      let best = g.points[0];
      for (const p of g.points)
        if (Math.abs(p.minusDeltaG0 - xv) < Math.abs(best.minusDeltaG0 - xv)) best = p;
      const lines = [
        `−ΔG° = ${formatSignificant(best.minusDeltaG0, 3)} eV`,
        `Marcus: log₁₀ k = ${formatFixed(best.marcus, 2)}`,
      ];
      if (g.hasMlj) lines.push(`MLJ: log₁₀ k = ${formatFixed(best.mlj, 2)}`);
      return { x: best.minusDeltaG0, lines };
    });
  }
}
