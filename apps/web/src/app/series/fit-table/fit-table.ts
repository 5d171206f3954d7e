import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import {
  formatMeasured,
  type SeriesFit,
  type SeriesModel,
  type SeriesModelFit,
} from '@gapwise/contracts';
import { RichText } from '../../shared/rich-text/rich-text';
import { formatFixed, formatSignificant } from '../../units/number-format';
import { MODEL_NAMES } from '../series-plot/series-plot';

const CM1_PER_EV = 8065.543937;

/** Fitted parameters with standard errors, correlation, residuals and AIC/BIC per model. */
@Component({
  selector: 'gw-fit-table',
  imports: [RichText],
  template: `
    @let f = fit();
    <div class="gw-table-scroll">
      <table class="gw-table fit-table">
        <caption>
          {{
            caption()
          }}
        </caption>
        <thead>
          <tr>
            <th scope="col">Model</th>
            <th scope="col" class="num">λ / eV</th>
            <th scope="col" class="num">|H<sub>AB</sub>| / meV</th>
            <th scope="col" class="num">|H<sub>AB</sub>| / cm⁻¹</th>
            <th scope="col" class="num">corr(λ, H)</th>
            <th scope="col" class="num">RMS residual / decades</th>
            <th scope="col" class="num">AIC</th>
            <th scope="col" class="num">BIC</th>
          </tr>
        </thead>
        <tbody>
          @for (row of rows(); track row.model) {
            <tr [class.primary]="row.model === f.preferred">
              <th scope="row">
                {{ names[row.model] }}
                @if (row.model === f.preferred && rows().length > 1) {
                  <span class="preferred">lower AIC</span>
                }
              </th>
              <td class="num">{{ measured(row.lambda, row.standardErrors.lambda) }}</td>
              <td class="num">
                {{ measured(row.coupling * 1000, row.standardErrors.coupling * 1000) }}
              </td>
              <td class="num">
                {{ measured(row.coupling * cm, row.standardErrors.coupling * cm) }}
              </td>
              <td class="num">{{ fx(row.correlation, 2) }}</td>
              <td class="num">{{ fx(row.rmsLog10Residual, 2) }}</td>
              <td class="num">{{ fx(row.aic, 1) }}</td>
              <td class="num">{{ fx(row.bic, 1) }}</td>
            </tr>
          }
        </tbody>
      </table>
    </div>
    @if (warnings().length) {
      <ul class="warnings" aria-label="Fit warnings">
        @for (w of warnings(); track $index) {
          <li>
            <strong>{{ names[w.model] }}:</strong> <gw-rich-text [text]="w.message" />
          </li>
        }
      </ul>
    }
    <p class="note">
      λ is the total reorganization energy for classical Marcus and the classical (solvent) part
      λ<sub>s</sub> for MLJ. Standard errors come from the linearised covariance; with few points
      treat them as rough.
    </p>
  `,
  styleUrl: '../series.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FitTable {
  readonly fit = input.required<SeriesFit>();
  readonly temperature = input.required<number>();

  protected readonly names = MODEL_NAMES;
  protected readonly cm = CM1_PER_EV;
  protected readonly fx = formatFixed;
  /** A fitted value ± its standard error, rounded to what the error supports. */
  protected readonly measured = (v: number, se: number | null) => formatMeasured(v, se);
  protected readonly sig = (v: number | null, d = 3) => formatSignificant(v, d);
  /**
   * "Fitted parameters (± one standard error; T = 298.15 K; fixed mode ħω = 0.18 eV, λ_v = 0.2 eV)",
   * built here so that no template line break puts a space before a semicolon.
   */
  protected readonly caption = computed(() => {
    const f = this.fit();
    const mode =
      f.hbarOmega !== null
        ? `; fixed mode ħω = ${this.sig(f.hbarOmega)} eV, λᵥ = ${this.sig(f.lambdaVib)} eV`
        : '';
    return `Fitted parameters (± one standard error; T = ${this.sig(this.temperature(), 5)} K${mode})`;
  });
  protected readonly rows = computed(() =>
    (['marcus', 'mlj'] as const)
      .map((m) => this.fit().fits[m])
      .filter((r): r is SeriesModelFit => !!r),
  );
  protected readonly warnings = computed(() =>
    this.rows().flatMap((r) =>
      r.warnings.map((w) => ({ model: r.model as SeriesModel, message: w.message })),
    ),
  );
}
