import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { histogramGeometry } from '@gapwise/plots';
import { RichText } from '../../shared/rich-text/rich-text';
import { formatFixed, formatSignificant } from '../../units/number-format';
import type { MonteCarloState } from './monte-carlo';

/** Drawing units of the histogram's viewBox: room left and below for ticks and axis titles. */
const HISTOGRAM_FRAME = {
  width: 320,
  height: 132,
  margin: { left: 38, bottom: 32, top: 6, right: 10 },
} as const;

/**
 * The Monte Carlo result of the pair being edited: median and 95 % interval of log10 k and the
 * distribution with axes (share of samples against log10 k), as the PDF prints it; or why it
 * was not run.
 */
@Component({
  selector: 'gw-monte-carlo-panel',
  imports: [RichText],
  templateUrl: './monte-carlo-panel.html',
  styleUrl: './monte-carlo-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MonteCarloPanel {
  readonly state = input<MonteCarloState>({ status: 'none' });

  protected readonly fmtFixed = formatFixed;
  /** A round tick value ("12.5", "−3"): at most 3 significant figures, U+2212 minus. */
  protected fmtTick(v: number): string {
    return formatSignificant(v, 3);
  }

  protected readonly histogram = computed(() => {
    const mc = this.state();
    if (mc.status !== 'done' || !mc.histogram) return null;
    return histogramGeometry(
      {
        edges: mc.histogram.edges,
        counts: mc.histogram.counts,
        low: mc.p025,
        high: mc.p975,
        median: mc.median,
      },
      HISTOGRAM_FRAME,
    );
  });

  protected readonly histogramFrame = HISTOGRAM_FRAME;
  /** As the PDF's axis title reads. */
  protected readonly xTitle = 'log10 (k / s⁻¹)';
}
