import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  computed,
  effect,
  input,
  viewChild,
} from '@angular/core';
import { line } from 'd3';
import { PlotExport } from '../../plots/plot-export/plot-export';
import { drawFrame } from '../../plots/plot-frame';
import type { GapBlockLevel, GapOutputs } from '../gap-outputs';

const COLOURS = { reactant: '#2f6fb3', product: '#c0581b' } as const;

/**
 * Block averaging (Flyvbjerg–Petersen): standard error of the mean against block length, with
 * the error of each estimate (1/√(2(n_b − 1))) as bars and the chosen plateau marked.
 */
@Component({
  selector: 'gw-block-plot',
  imports: [PlotExport],
  template: `
    <figure class="plot">
      <figcaption>
        <span class="title">Block-averaged standard error of the mean against block length</span>
        <span class="spacer"></span>
        <gw-plot-export
          [svg]="svgEl()"
          filename="gapwise-block-analysis"
          what="the block analysis"
        />
      </figcaption>
      <svg #svg class="block-svg" width="100%" preserveAspectRatio="xMidYMid meet"></svg>
      <p class="legend">
        <span class="key reactant">● reactant</span>
        <span class="key product">■ product</span>
        <span class="key">◯ plateau used for the error bars (≥ 10 blocks)</span>
      </p>
    </figure>
  `,
  styleUrl: '../../plots/plot.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BlockPlot {
  readonly outputs = input.required<GapOutputs>();
  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  protected readonly svgEl = computed(() => this.svgRef().nativeElement);

  constructor() {
    effect(() => this.draw(this.svgRef().nativeElement, this.outputs()));
  }

  private draw(svgEl: SVGSVGElement, o: GapOutputs): void {
    const states = ['reactant', 'product'] as const;
    const levels = Object.fromEntries(
      states.map((s) => [s, o.blockAnalysis[s].filter((l) => l.blocks >= 2)]),
    ) as Record<(typeof states)[number], GapBlockLevel[]>;
    const err = (l: GapBlockLevel) => l.standardError / Math.sqrt(2 * (l.blocks - 1));
    const all = states.flatMap((s) => levels[s]);
    const xMax = Math.log2(Math.max(...all.map((l) => l.blockSize)));
    const yMax = Math.max(
      ...all.filter((l) => l.blocks >= 10).map((l) => l.standardError + err(l)),
      ...all.map((l) => l.standardError),
    );
    const f = drawFrame(svgEl, 'block', {
      width: 640,
      height: 320,
      margin: { top: 14, right: 20, bottom: 48, left: 70 },
      xDomain: [-0.3, xMax + 0.3],
      yDomain: [
        0,
        Math.min(
          yMax,
          3 * Math.max(o.blockPlateau.reactant.standardError, o.blockPlateau.product.standardError),
        ) * 1.1,
      ],
      xLabel: 'log₂ (block length / frames)',
      yLabel: 'SE of the mean / eV',
      title: `Block analysis: plateau SE ${o.blockPlateau.reactant.standardError.toExponential(2)} (reactant), ${o.blockPlateau.product.standardError.toExponential(2)} eV (product)`,
    });
    for (const s of states) {
      const data = levels[s];
      const g = f.plot.append('g').attr('class', `levels ${s}`);
      g.selectAll('line')
        .data(data)
        .join('line')
        .attr('x1', (l) => f.x(Math.log2(l.blockSize)))
        .attr('x2', (l) => f.x(Math.log2(l.blockSize)))
        .attr('y1', (l) => f.y(l.standardError - err(l)))
        .attr('y2', (l) => f.y(l.standardError + err(l)))
        .attr('stroke', COLOURS[s])
        .attr('stroke-opacity', (l) => (l.blocks >= 10 ? 0.9 : 0.3));
      g.append('path')
        .attr(
          'd',
          line<GapBlockLevel>()
            .x((l) => f.x(Math.log2(l.blockSize)))
            .y((l) => f.y(l.standardError))(data),
        )
        .attr('fill', 'none')
        .attr('stroke', COLOURS[s])
        .attr('stroke-width', 1.5);
      const mark = g
        .selectAll('.mark')
        .data(data)
        .join(s === 'reactant' ? 'circle' : 'rect')
        .attr('class', 'mark');
      if (s === 'reactant')
        mark
          .attr('cx', (l) => f.x(Math.log2(l.blockSize)))
          .attr('cy', (l) => f.y(l.standardError))
          .attr('r', 3.2);
      else
        mark
          .attr('x', (l) => f.x(Math.log2(l.blockSize)) - 3)
          .attr('y', (l) => f.y(l.standardError) - 3)
          .attr('width', 6)
          .attr('height', 6);
      mark.attr('fill', COLOURS[s]).attr('fill-opacity', (l) => (l.blocks >= 10 ? 1 : 0.35));
      const plateau = o.blockPlateau[s];
      f.plot
        .append('circle')
        .attr('class', `plateau ${s}`)
        .attr('cx', f.x(Math.log2(plateau.blockSize)))
        .attr('cy', f.y(plateau.standardError))
        .attr('r', 8)
        .attr('fill', 'none')
        .attr('stroke', COLOURS[s])
        .attr('stroke-width', 2);
    }
  }
}
