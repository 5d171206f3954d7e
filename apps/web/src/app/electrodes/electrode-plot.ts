import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  computed,
  effect,
  input,
  viewChild,
} from '@angular/core';
import { linePath } from '@gapwise/plots';
import { PlotExport } from '../plots/plot-export/plot-export';
import { drawFrame } from '../plots/plot-frame';

export interface PlotCurve {
  readonly label: string;
  readonly colour: string;
  readonly dash: string | null;
  readonly points: ReadonlyArray<{ readonly x: number; readonly y: number | null }>;
}

export interface PlotMarker {
  readonly x: number;
  readonly y: number;
  readonly colour: string;
  readonly title: string;
}

const W = 640;
const H = 380;
const MARGIN = { top: 14, right: 18, bottom: 48, left: 62 };

/** Data domains of curves and markers, padded by 5 %; y limited to `yClip` when given. */
export function plotDomains(
  curves: readonly PlotCurve[],
  markers: readonly PlotMarker[],
  yClip?: readonly [number, number],
): { x: [number, number]; y: [number, number] } {
  const xs: number[] = [];
  const ys: number[] = [];
  for (const c of curves)
    for (const p of c.points) {
      if (p.y === null || !Number.isFinite(p.y)) continue;
      if (yClip && (p.y < yClip[0] || p.y > yClip[1])) continue;
      xs.push(p.x);
      ys.push(p.y);
    }
  for (const m of markers) {
    xs.push(m.x);
    ys.push(m.y);
  }
  if (!xs.length) return { x: [-1, 1], y: [0, 1] };
  const pad = (lo: number, hi: number): [number, number] => {
    const span = Math.max(hi - lo, 1e-6);
    return [lo - span * 0.05, hi + span * 0.05];
  };
  return {
    x: pad(Math.min(...xs), Math.max(...xs)),
    y: pad(Math.min(...ys), Math.max(...ys)),
  };
}

/** A line plot of the electrode page: curves with a legend and measured markers. */
@Component({
  selector: 'gw-electrode-plot',
  imports: [PlotExport],
  template: `
    <figure class="plot">
      <figcaption>
        <span class="title">{{ heading() }}</span>
        <span class="spacer"></span>
        <gw-plot-export [svg]="svgEl()" [filename]="filename()" [what]="heading()" />
      </figcaption>
      <svg #svg width="100%" preserveAspectRatio="xMidYMid meet"></svg>
      <p class="legend">
        @for (c of curves(); track c.label) {
          <span class="key" [style.color]="c.colour"
            >{{ c.dash ? '- - -' : '━━' }} {{ c.label }}</span
          >
        }
        @if (markers().length) {
          <span class="key">● {{ markerLabel() }}</span>
        }
      </p>
    </figure>
  `,
  styleUrl: '../plots/plot.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ElectrodePlot {
  readonly plotId = input.required<string>();
  readonly heading = input.required<string>();
  readonly xLabel = input.required<string>();
  readonly yLabel = input.required<string>();
  readonly curves = input.required<readonly PlotCurve[]>();
  readonly markers = input<readonly PlotMarker[]>([]);
  readonly markerLabel = input('measured');
  readonly yClip = input<readonly [number, number] | undefined>(undefined);
  readonly filename = input('gapwise-electrode');

  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  protected readonly svgEl = computed(() => this.svgRef().nativeElement);

  constructor() {
    effect(() => this.draw(this.svgRef().nativeElement));
  }

  private draw(svgEl: SVGSVGElement): void {
    const curves = this.curves();
    const markers = this.markers();
    const d = plotDomains(curves, markers, this.yClip());
    const f = drawFrame(svgEl, this.plotId(), {
      width: W,
      height: H,
      margin: MARGIN,
      xDomain: d.x,
      yDomain: d.y,
      xLabel: this.xLabel(),
      yLabel: this.yLabel(),
      title: this.heading(),
    });
    for (const c of curves) {
      f.plot
        .append('path')
        .attr('class', 'curve')
        .attr('d', linePath(c.points, f.x, f.y))
        .attr('fill', 'none')
        .attr('stroke', c.colour)
        .attr('stroke-width', 2)
        .attr('stroke-dasharray', c.dash);
    }
    const g = f.plot.append('g').attr('class', 'points');
    for (const m of markers) {
      g.append('circle')
        .attr('cx', f.x(m.x))
        .attr('cy', f.y(m.y))
        .attr('r', 4.5)
        .attr('fill', m.colour)
        .attr('stroke', '#ffffff')
        .attr('stroke-width', 1)
        .append('title')
        .text(m.title);
    }
  }
}
