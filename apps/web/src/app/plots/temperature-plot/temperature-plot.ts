import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  computed,
  effect,
  input,
  output,
  signal,
  viewChild,
} from '@angular/core';
import {
  KCAL_PER_MOL_PER_EV,
  KJ_PER_MOL_PER_EV,
  parseStrictNumber,
  type CalcRequest,
} from '@gapwise/calc';
import {
  arrheniusFitGeometry,
  temperatureCurve,
  type ArrheniusFitGeometry,
  type MeasuredRate,
  type TemperatureGeometry,
} from '@gapwise/plots';
import { line } from 'd3';
import { formatFixed, formatSignificant } from '../../units/number-format';
import { PlotExport } from '../plot-export/plot-export';
import { attachHover, drawFrame } from '../plot-frame';

const W = 600;
const H = 340;
const MARGIN = { top: 16, right: 24, bottom: 48, left: 62 };

/** Arrhenius plot of the pair's rate model, with the apparent activation energy at its T. */
@Component({
  selector: 'gw-temperature-plot',
  imports: [PlotExport],
  template: `
    <figure class="plot">
      <figcaption>
        <span class="title">Rate against temperature (Arrhenius form)</span>
        <span class="spacer"></span>
        <gw-plot-export [svg]="svgEl()" [filename]="filename()" what="the Arrhenius plot" />
      </figcaption>
      <svg #svg width="100%" preserveAspectRatio="xMidYMid meet"></svg>
      @if (geometry(); as g) {
        <p class="legend">
          <span class="key marcus">━━ log₁₀ k of the chosen model</span>
          <span class="key">◆ this pair at {{ temperatureText() }}</span>
          @if (eaText(); as ea) {
            <span class="key"
              ><strong>Apparent E<sub>a</sub> = {{ ea }}</strong></span
            >
          }
        </p>
        @if (fit(); as fit) {
          @if (fit.ea; as ea) {
            <p class="legend measured-fit">
              <span class="key">● measured k(T)</span>
              <span class="key"
                >╌ Arrhenius fit: E<sub>a</sub> = {{ formatEv(ea.value) }} ±
                {{ formatEv(ea.error) }} eV</span
              >
              @if (fit.eyring; as ey) {
                <span class="key"
                  >Eyring: ΔH‡ = {{ formatEv(ey.enthalpy) }} ± {{ formatEv(ey.enthalpyError) }} eV,
                  ΔS‡ = {{ formatEntropy(ey.entropy) }} ± {{ formatEntropy(ey.entropyError) }} J
                  mol⁻¹ K⁻¹</span
                >
              }
            </p>
          }
        }
        <p class="note">
          E<sub>a</sub> = −k<sub>B</sub> d ln k / d(1/T) at the pair's temperature; with λ and ΔG°
          held fixed the classical value is ΔG‡ − k<sub>B</sub>T/2.
        </p>
        <label class="measured-input">
          <span>Measured rates: one “T/K k/s⁻¹” pair per line (≥ 3 temperatures for a fit)</span>
          <textarea
            rows="4"
            spellcheck="false"
            placeholder="280 2.1e6&#10;300 6.0e6&#10;320 1.6e7"
            [value]="measuredText()"
            (input)="measuredText.set($any($event.target).value)"
          ></textarea>
        </label>
        @for (message of measuredErrors(); track $index) {
          <p class="error" role="alert">{{ message }}</p>
        }
      } @else {
        <p class="empty">A rate is needed to draw its temperature dependence.</p>
      }
    </figure>
  `,
  styleUrl: '../plot.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TemperaturePlot {
  readonly request = input.required<CalcRequest | null>();
  readonly temperature = input.required<number | null>();
  readonly filename = input('gapwise-rate-vs-temperature');
  readonly redrawn = output<void>();

  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  protected readonly svgEl = computed(() => this.svgRef().nativeElement);
  protected readonly geometry = computed(() => {
    const r = this.request();
    const t = this.temperature();
    if (!r || !t || !(t > 0)) return null;
    const g = temperatureCurve(r, t);
    return g.points.some((p) => p.log10k !== null) ? g : null;
  });
  /** Measured k(T) typed by the user, one "T k" pair per line (not saved with the pair). */
  protected readonly measuredText = signal('');
  private readonly measured = computed(() => parseMeasuredRates(this.measuredText()));
  protected readonly fit = computed((): ArrheniusFitGeometry | null => {
    const g = this.geometry();
    const { points } = this.measured();
    if (!g || points.length === 0) return null;
    return arrheniusFitGeometry(points, g.inverseTDomain, g.log10kDomain);
  });
  protected readonly measuredErrors = computed(() => [
    ...this.measured().errors,
    ...(this.fit()?.errors ?? []),
  ]);
  protected formatEv(value: number): string {
    return formatSignificant(value, 3);
  }
  protected formatEntropy(value: number): string {
    return formatSignificant(value, 3);
  }
  protected readonly temperatureText = computed(
    () => `${formatSignificant(this.temperature(), 5)} K`,
  );
  protected readonly eaText = computed(() => {
    const ea = this.geometry()?.apparentEa;
    if (ea === null || ea === undefined) return null;
    return `${formatSignificant(ea, 3)} eV = ${formatSignificant(ea * KJ_PER_MOL_PER_EV, 3)} kJ/mol = ${formatSignificant(ea * KCAL_PER_MOL_PER_EV, 3)} kcal/mol`;
  });

  constructor() {
    effect(() => {
      const g = this.geometry();
      const fit = this.fit();
      const svg = this.svgRef().nativeElement;
      if (g) this.draw(svg, g, fit);
      else svg.replaceChildren();
      this.redrawn.emit();
    });
  }

  private draw(
    svgEl: SVGSVGElement,
    g: TemperatureGeometry,
    fit: ArrheniusFitGeometry | null,
  ): void {
    const f = drawFrame(svgEl, 'arrhenius', {
      width: W,
      height: H,
      margin: MARGIN,
      xDomain: fit?.inverseTDomain ?? g.inverseTDomain,
      yDomain: fit?.log10kDomain ?? g.log10kDomain,
      xLabel: '1000 / T / K⁻¹',
      yLabel: 'log₁₀(k / s⁻¹)',
      title: `Arrhenius plot; apparent activation energy ${this.eaText() ?? 'not available'}`,
    });
    const { plot, overlay, x, y } = f;
    type P = TemperatureGeometry['points'][number];
    plot
      .append('path')
      .attr('class', 'curve arrhenius')
      .attr(
        'd',
        line<P>()
          .defined((p) => p.log10k !== null)
          .x((p) => x(p.inverseT))
          .y((p) => y(p.log10k as number))(g.points as P[]),
      )
      .attr('fill', 'none')
      .attr('stroke', '#006a6a')
      .attr('stroke-width', 2.4);
    if (fit?.line) {
      plot
        .append('path')
        .attr('class', 'curve measured-fit')
        .attr(
          'd',
          `M${x(fit.line[0]!.x)},${y(fit.line[0]!.y)}L${x(fit.line[1]!.x)},${y(fit.line[1]!.y)}`,
        )
        .attr('fill', 'none')
        .attr('stroke', '#9a6400')
        .attr('stroke-width', 1.8)
        .attr('stroke-dasharray', '6 4');
    }
    for (const p of fit?.measured ?? []) {
      overlay
        .append('circle')
        .attr('class', 'measured')
        .attr('cx', x(p.x))
        .attr('cy', y(p.y))
        .attr('r', 4.5)
        .attr('fill', '#ffffff')
        .attr('stroke', '#9a6400')
        .attr('stroke-width', 2);
    }
    if (g.pair) {
      const px = x(g.pair.x);
      const py = y(g.pair.y);
      overlay
        .append('path')
        .attr('d', `M${px},${py - 7}L${px + 7},${py}L${px},${py + 7}L${px - 7},${py}Z`)
        .attr('fill', '#e0a020')
        .attr('stroke', '#1f2b2b')
        .attr('stroke-width', 1.2);
      overlay
        .append('text')
        .attr('x', px + 10)
        .attr('y', py - 10)
        .attr('font-weight', 600)
        .attr('fill', '#1f2b2b')
        .text(`${formatSignificant(this.temperature(), 5)} K`);
    }
    attachHover(f, (xv) => {
      let best = g.points[0];
      for (const p of g.points)
        if (Math.abs(p.inverseT - xv) < Math.abs(best.inverseT - xv)) best = p;
      return {
        x: best.inverseT,
        lines: [
          `T = ${formatSignificant(best.temperature, 4)} K`,
          `log₁₀ k = ${formatFixed(best.log10k, 2)}`,
        ],
      };
    });
  }
}

/**
 * Reads measured rates typed one "T k" pair per line (whitespace, tab or ';' between them),
 * strictly: every bad line is listed (VALIDATION.md A16), blank lines are skipped.
 */
export function parseMeasuredRates(text: string): {
  points: MeasuredRate[];
  errors: string[];
} {
  const points: MeasuredRate[] = [];
  const errors: string[] = [];
  text.split(/\r?\n/).forEach((raw, i) => {
    const line = raw.trim();
    if (line === '') return;
    const cells = line.split(/[\s;]+/);
    if (cells.length !== 2) {
      errors.push(`Line ${i + 1}: expected 2 values (T/K and k/s⁻¹).`);
      return;
    }
    const [t, k] = cells.map((cell) => parseStrictNumber(cell));
    const bad = cells.find((_, j) => [t, k][j] === undefined);
    if (bad !== undefined) {
      errors.push(`Line ${i + 1}: '${bad}' is not a number.`);
      return;
    }
    if (!(t! > 0) || !(k! > 0)) {
      errors.push(`Line ${i + 1}: T and k must be > 0.`);
      return;
    }
    points.push({ temperature: t!, k: k! });
  });
  return { points, errors: errors.slice(0, 20) };
}
