import {
  ChangeDetectionStrategy,
  Component,
  computed,
  ElementRef,
  input,
  viewChild,
} from '@angular/core';
import { formatNumber, formatScientific } from '@gapwise/contracts';
import { energyLevels, type PlotBox } from '@gapwise/plots';
import { PlotExport } from '../../plots/plot-export/plot-export';
import type { NetworkOutputs } from '../cascade-compute';
import type { StateKind } from '../cascade-design';
import { energyTicks, KIND_COLOURS } from './state-colours';

export interface DiagramState {
  readonly id: string;
  readonly label: string;
  readonly kind: StateKind;
  readonly energyEv: number;
}

const BOX: PlotBox = { width: 720, height: 420, left: 64, right: 16, top: 24, bottom: 24 };

/**
 * The state-energy diagram: one level per state at its free energy, an arrow for every step
 * (forward ET steps, fixed decays and the detailed-balance reverses that carry flux) labelled with
 * its rate, its thickness by integrated flux. Geometry from `@gapwise/plots` (energyLevels).
 */
@Component({
  selector: 'gw-state-energy-diagram',
  imports: [PlotExport],
  template: `
    <figure class="plot">
      <figcaption>
        <span>State-energy diagram</span>
        <gw-plot-export [svg]="svg()" [filename]="filename()" what="the state-energy diagram" />
      </figcaption>
      <svg
        #plotSvg
        class="cascade-svg"
        [attr.viewBox]="'0 0 ' + box.width + ' ' + box.height"
        role="img"
        aria-label="State-energy diagram: levels at their free energies, steps with their rates"
      >
        <title>State-energy diagram</title>
        <defs>
          <marker
            id="sed-head"
            viewBox="0 0 10 10"
            refX="9"
            refY="5"
            markerUnits="userSpaceOnUse"
            markerWidth="9"
            markerHeight="9"
            orient="auto-start-reverse"
          >
            <path d="M0,0 L10,5 L0,10 z" fill="#455a64" />
          </marker>
        </defs>
        <rect x="0" y="0" [attr.width]="box.width" [attr.height]="box.height" fill="#ffffff" />
        <g class="axis" font-size="11" fill="#455a64">
          <line
            [attr.x1]="box.left - 8"
            [attr.x2]="box.left - 8"
            [attr.y1]="box.top"
            [attr.y2]="box.height - box.bottom"
            stroke="#90a4ae"
          />
          @for (t of geometry().ticks; track t.value) {
            <line
              [attr.x1]="box.left - 12"
              [attr.x2]="box.left - 8"
              [attr.y1]="t.y"
              [attr.y2]="t.y"
              stroke="#90a4ae"
            />
            <text [attr.x]="box.left - 14" [attr.y]="t.y + 4" text-anchor="end">{{ t.text }}</text>
          }
          <text
            [attr.transform]="'translate(14,' + box.height / 2 + ') rotate(-90)'"
            text-anchor="middle"
          >
            G / eV
          </text>
        </g>
        @for (a of geometry().arrows; track a.key) {
          <g class="step">
            <path
              [attr.d]="a.d"
              fill="none"
              stroke="#455a64"
              [attr.stroke-width]="a.width"
              [attr.stroke-dasharray]="a.dashed ? '5 4' : null"
              marker-end="url(#sed-head)"
              opacity="0.85"
            />
            <text
              [attr.x]="a.lx"
              [attr.y]="a.ly"
              font-size="10"
              fill="#263238"
              text-anchor="middle"
              paint-order="stroke"
              stroke="#ffffff"
              stroke-width="3"
            >
              {{ a.label }}
            </text>
          </g>
        }
        @for (l of geometry().levels; track l.id) {
          <g class="level" [attr.data-state]="l.id">
            <line
              [attr.x1]="l.x1"
              [attr.x2]="l.x2"
              [attr.y1]="l.y"
              [attr.y2]="l.y"
              [attr.stroke]="l.colour"
              stroke-width="3"
            />
            <text
              [attr.x]="(l.x1 + l.x2) / 2"
              [attr.y]="l.y - 6"
              font-size="12"
              text-anchor="middle"
              [attr.fill]="l.colour"
            >
              {{ l.label }}
            </text>
            <text
              [attr.x]="(l.x1 + l.x2) / 2"
              [attr.y]="l.y + 14"
              font-size="10"
              text-anchor="middle"
              fill="#546e7a"
            >
              {{ l.energy }}
            </text>
          </g>
        }
      </svg>
    </figure>
  `,
  styleUrl: './cascade-plot.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StateEnergyDiagram {
  readonly states = input.required<readonly DiagramState[]>();
  readonly outputs = input.required<NetworkOutputs>();
  readonly filename = input('state-energy-diagram');
  protected readonly box = BOX;
  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('plotSvg');
  protected readonly svg = computed(() => this.svgRef().nativeElement);

  protected readonly geometry = computed(() => {
    const states = this.states();
    const out = this.outputs();
    // Columns left to right: ground, excited, charge-separated, products (a step reads forward).
    const order = Object.keys(KIND_COLOURS);
    const ordered = [...states].sort((a, b) => order.indexOf(a.kind) - order.indexOf(b.kind));
    const { levels, y } = energyLevels(
      ordered.map((s) => ({ id: s.id, energy: s.energyEv })),
      BOX,
      { columnPerState: true },
    );
    const at = new Map(levels.map((l) => [l.id, l]));
    const energies = states.map((s) => s.energyEv);
    const lo = Math.min(0, ...energies);
    const hi = Math.max(...energies);
    const ticks = energyTicks(lo, hi).map((v) => ({ value: v, y: y(v), text: formatNumber(v, 3) }));
    const fluxOf = new Map(out.flux.map((f) => [`${f.from}>${f.to}`, f.flux]));
    const maxFlux = Math.max(1e-300, ...out.flux.map((f) => f.flux));
    const shown = out.rates.filter(
      (r) =>
        r.included &&
        (r.source !== 'detailedBalance' || (fluxOf.get(`${r.from}>${r.to}`) ?? 0) > 0.01 * maxFlux),
    );
    const arrows = shown.flatMap((r, i) => {
      const a = at.get(r.from);
      const b = at.get(r.to);
      if (!a || !b) return [];
      const flux = fluxOf.get(`${r.from}>${r.to}`) ?? 0;
      // Leave from the side of the level facing the target; reverse steps bow the other way.
      const right = b.x1 >= a.x2;
      const ax = right ? a.x2 - 6 : a.x1 + 6;
      const bx = right ? b.x1 + 6 : b.x2 - 6;
      const bow = (r.source === 'detailedBalance' ? -1 : 1) * (18 + (i % 3) * 8);
      const mx = (ax + bx) / 2;
      const my = (a.y + b.y) / 2 - bow;
      const gap = 0;
      return [
        {
          key: `${r.from}>${r.to}>${r.link}`,
          d: `M${ax.toFixed(1)},${a.y.toFixed(1)} Q${mx.toFixed(1)},${my.toFixed(1)} ${bx.toFixed(1)},${(b.y + gap).toFixed(1)}`,
          width: (1 + 5 * Math.sqrt(flux / maxFlux)).toFixed(2),
          dashed: r.source !== 'electronTransfer' && r.source !== 'detailedBalance',
          lx: (ax + bx) / 4 + mx / 2,
          ly: (a.y + b.y) / 4 + my / 2,
          label: `${formatScientific(r.k, 2)} s⁻¹`,
        },
      ];
    });
    return {
      ticks,
      arrows,
      levels: levels.map((l) => {
        const s = states.find((x) => x.id === l.id)!;
        return {
          ...l,
          label: s.label || s.id,
          colour: KIND_COLOURS[s.kind],
          energy: `${formatNumber(s.energyEv, 3)} eV`,
        };
      }),
    };
  });
}
