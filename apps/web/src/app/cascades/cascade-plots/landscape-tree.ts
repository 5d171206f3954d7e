import {
  ChangeDetectionStrategy,
  Component,
  computed,
  ElementRef,
  input,
  viewChild,
} from '@angular/core';
import { formatNumber, formatScientific } from '@gapwise/contracts';
import { disconnectivityLayout, type PlotBox } from '@gapwise/plots';
import { PlotExport } from '../../plots/plot-export/plot-export';
import type { NetworkOutputs } from '../cascade-compute';
import type { DiagramState } from './state-energy-diagram';
import { energyTicks, KIND_COLOURS } from './state-colours';

const TREE_BOX: PlotBox = { width: 720, height: 360, left: 64, right: 16, top: 20, bottom: 40 };

/**
 * The energy landscape tree (disconnectivity graph; Becker & Karplus 1997, Wales et al. 1998):
 * minima are the states at their free energies, ET steps join basins at their transition-state
 * energies G_i + ΔG‡. Decays have no transition state and are listed beneath, separately.
 * Tree from the core's `landscape.tree`, geometry from `@gapwise/plots` (disconnectivityLayout).
 */
@Component({
  selector: 'gw-landscape-tree',
  imports: [PlotExport],
  template: `
    <figure class="plot">
      <figcaption>
        <span>Energy landscape tree</span>
        <gw-plot-export [svg]="svg()" [filename]="filename()" what="the energy landscape tree" />
      </figcaption>
      <svg
        #plotSvg
        class="cascade-svg"
        [attr.viewBox]="'0 0 ' + box.width + ' ' + height()"
        role="img"
        aria-label="Energy landscape tree: states joined at their transition-state energies"
      >
        <title>Energy landscape tree</title>
        <rect x="0" y="0" [attr.width]="box.width" [attr.height]="height()" fill="#ffffff" />
        <g class="axis" font-size="11" fill="#455a64">
          <line
            [attr.x1]="box.left - 8"
            [attr.x2]="box.left - 8"
            [attr.y1]="box.top"
            [attr.y2]="box.height - box.bottom"
            stroke="#90a4ae"
          />
          @for (t of layout().ticks; track t.value) {
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
        @for (s of layout().segments; track $index) {
          <line
            class="edge"
            [attr.x1]="s.x1"
            [attr.y1]="s.y1"
            [attr.x2]="s.x2"
            [attr.y2]="s.y2"
            stroke="#263238"
            stroke-width="1.6"
          />
        }
        @for (j of layout().joins; track j.id) {
          <text [attr.x]="j.x + 4" [attr.y]="j.y - 4" font-size="10" fill="#546e7a">
            {{ j.text }}
          </text>
        }
        @for (m of layout().minima; track m.id) {
          <g class="minimum" [attr.data-state]="m.id">
            <circle [attr.cx]="m.x" [attr.cy]="m.y" r="4" [attr.fill]="m.colour" />
            <text
              [attr.x]="m.x"
              [attr.y]="m.y + 16"
              font-size="11"
              text-anchor="middle"
              [attr.fill]="m.colour"
            >
              {{ m.label }}
            </text>
          </g>
        }
        @if (layout().decays.length) {
          <g class="decays" font-size="11" fill="#37474f">
            <text [attr.x]="box.left" [attr.y]="box.height + 4" font-weight="600">
              Decays (no transition state; not part of the tree):
            </text>
            @for (d of layout().decays; track $index) {
              <text
                [attr.x]="box.left + ($index % 2) * 320"
                [attr.y]="box.height + 22 + 16 * floor($index / 2)"
              >
                {{ d }}
              </text>
            }
          </g>
        }
      </svg>
    </figure>
  `,
  styleUrl: './cascade-plot.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LandscapeTree {
  readonly states = input.required<readonly DiagramState[]>();
  readonly outputs = input.required<NetworkOutputs>();
  readonly filename = input('energy-landscape-tree');
  protected readonly box = TREE_BOX;
  protected readonly floor = Math.floor;
  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('plotSvg');
  protected readonly svg = computed(() => this.svgRef().nativeElement);
  protected readonly height = computed(
    () =>
      TREE_BOX.height +
      (this.layout().decays.length ? 16 + 16 * Math.ceil(this.layout().decays.length / 2) : 0),
  );

  protected readonly layout = computed(() => {
    const out = this.outputs();
    const states = this.states();
    const name = (id: string) => {
      const s = states.find((x) => x.id === id);
      return s?.label || id;
    };
    const tree = out.landscape.tree;
    const { points, segments, y } = disconnectivityLayout(tree.nodes, tree.roots, TREE_BOX);
    const energies = tree.nodes.map((n) => n.energy);
    const ticks = energyTicks(Math.min(...energies), Math.max(...energies)).map((v) => ({
      value: v,
      y: y(v),
      text: formatNumber(v, 3),
    }));
    const minima = tree.nodes
      .filter((n) => n.kind === 'minimum')
      .map((n) => {
        const s = states.find((x) => x.id === n.id);
        return {
          id: n.id,
          x: points[n.id]?.x ?? 0,
          y: points[n.id]?.y ?? 0,
          label: name(n.id),
          colour: s ? KIND_COLOURS[s.kind] : '#37474f',
        };
      });
    const joins = tree.nodes
      .filter((n) => n.kind === 'join' && points[n.id])
      .map((n) => ({
        id: n.id,
        x: points[n.id].x,
        y: points[n.id].y,
        text: `${formatNumber(n.energy, 3)} eV`,
      }));
    const decays = out.landscape.decays.map(
      (d) => `${name(d.from)} → ${name(d.to)}: k = ${formatScientific(d.k, 2)} s⁻¹`,
    );
    return { segments, ticks, minima, joins, decays };
  });
}
