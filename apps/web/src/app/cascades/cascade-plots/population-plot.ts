import {
  ChangeDetectionStrategy,
  Component,
  computed,
  ElementRef,
  input,
  viewChild,
} from '@angular/core';
import { populationPaths, type PlotBox } from '@gapwise/plots';
import { PlotExport } from '../../plots/plot-export/plot-export';
import type { NetworkOutputs } from '../cascade-compute';
import type { DiagramState } from './state-energy-diagram';
import { KIND_COLOURS } from './state-colours';

const POP_BOX: PlotBox = { width: 900, height: 300, left: 52, right: 16, top: 12, bottom: 40 };
const SUPERSCRIPT: Record<string, string> = {
  '-': '⁻',
  '0': '⁰',
  '1': '¹',
  '2': '²',
  '3': '³',
  '4': '⁴',
  '5': '⁵',
  '6': '⁶',
  '7': '⁷',
  '8': '⁸',
  '9': '⁹',
};

/** Populations of every state against time on a log axis (fs → s), from the core's grid. */
@Component({
  selector: 'gw-population-plot',
  imports: [PlotExport],
  template: `
    <figure class="plot">
      <figcaption>
        <span>Populations against time</span>
        <gw-plot-export [svg]="svg()" [filename]="filename()" what="the population plot" />
      </figcaption>
      <svg
        #plotSvg
        class="cascade-svg"
        [attr.viewBox]="'0 0 ' + box.width + ' ' + box.height"
        role="img"
        aria-label="Population of each state against time, log time axis"
      >
        <title>Populations against time</title>
        <rect x="0" y="0" [attr.width]="box.width" [attr.height]="box.height" fill="#ffffff" />
        <g font-size="10" fill="#455a64">
          @for (d of plot().decades; track d.exponent) {
            @if (d.exponent % d.every === 0) {
              <line
                [attr.x1]="d.x"
                [attr.x2]="d.x"
                [attr.y1]="box.top"
                [attr.y2]="box.height - box.bottom"
                stroke="#eceff1"
              />
              <text [attr.x]="d.x" [attr.y]="box.height - box.bottom + 14" text-anchor="middle">
                {{ d.text }}
              </text>
            }
          }
          <text [attr.x]="box.width / 2" [attr.y]="box.height - 6" text-anchor="middle">t / s</text>
          @for (p of [0, 0.5, 1]; track p) {
            <text
              [attr.x]="box.left - 6"
              [attr.y]="box.top + (1 - p) * (box.height - box.top - box.bottom) + 4"
              text-anchor="end"
            >
              {{ p }}
            </text>
          }
          <text
            [attr.transform]="'translate(12,' + box.height / 2 + ') rotate(-90)'"
            text-anchor="middle"
          >
            population
          </text>
        </g>
        @for (c of plot().curves; track c.id) {
          <path
            [attr.d]="c.d"
            fill="none"
            [attr.stroke]="c.colour"
            stroke-width="2"
            [attr.stroke-dasharray]="c.dash"
          />
        }
      </svg>
      <ul class="legend">
        @for (c of plot().curves; track c.id) {
          <li><span class="swatch" [style.background]="c.colour"></span>{{ c.label }}</li>
        }
      </ul>
    </figure>
  `,
  styleUrl: './cascade-plot.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PopulationPlot {
  readonly states = input.required<readonly DiagramState[]>();
  readonly outputs = input.required<NetworkOutputs>();
  readonly filename = input('populations');
  protected readonly box = POP_BOX;
  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('plotSvg');
  protected readonly svg = computed(() => this.svgRef().nativeElement);

  protected readonly plot = computed(() => {
    const out = this.outputs();
    const { paths, decades } = populationPaths(out.times, out.populations, POP_BOX);
    const every = decades.length > 12 ? 3 : decades.length > 7 ? 2 : 1;
    const seen = new Map<string, number>();
    return {
      decades: decades.map((d) => ({
        ...d,
        every,
        text: `10${String(d.exponent)
          .split('')
          .map((c) => SUPERSCRIPT[c] ?? c)
          .join('')}`,
      })),
      curves: this.states().map((s) => {
        const n = seen.get(s.kind) ?? 0;
        seen.set(s.kind, n + 1);
        return {
          id: s.id,
          d: paths[s.id] ?? '',
          colour: KIND_COLOURS[s.kind],
          dash: ['', '6 3', '2 3', '8 3 2 3'][n % 4] || null,
          label: s.label || s.id,
        };
      }),
    };
  });
}
