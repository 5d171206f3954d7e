import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import {
  formatEnergyEv,
  formatNumber,
  formatRate,
  formatRegime,
  formatScientific,
  type ReportCascadeSnapshot,
  type ReportCascadeValue,
} from '@gapwise/contracts';
import { RichText } from '../../shared/rich-text/rich-text';

const STATE_KIND_TEXT: Record<string, string> = {
  ground: 'Ground',
  excited: 'Excited',
  chargeSeparated: 'Charge-separated',
  product: 'Product',
  other: 'Other',
};

const STEP_TYPE_TEXT: Record<string, string> = {
  fixed: 'Given',
  electronTransfer: 'ET',
  detailedBalance: 'ET reverse',
};

/**
 * A yield or lifetime as reports print it: 3 significant figures (a yield as a fraction, a
 * lifetime in scientific notation), with its 95 % Monte Carlo interval when one was computed.
 */
export function cascadeValueText(v: ReportCascadeValue): string {
  const unit = v.unit ? ` ${v.unit}` : '';
  // A yield keeps its trailing zeros (1.00, not 1: three figures are known either way).
  const show = (x: number) => (v.unit === 's' ? formatScientific(x, 3) : formatNumber(x, 3, true));
  const main = `${show(v.value)}${unit}`;
  if (v.low === null || v.high === null) return main;
  return `${main} (95 % interval ${show(v.low)} to ${show(v.high)}${unit})`;
}

/** The cascade part of a report (kind `cascade`): results, states, steps, warnings. */
@Component({
  selector: 'gw-report-cascade',
  imports: [RichText],
  template: `
    @let c = cascade();
    <section class="cascade" [attr.aria-label]="c.name">
      <h2>
        {{ c.name }} <span class="version">v{{ c.cascadeVersion }}</span>
      </h2>
      <p class="sub">
        Cascade of {{ c.states.length }} states and {{ c.steps.length }} steps ·
        {{ num(c.temperatureK, 5) }} K
      </p>
      @if (c.notes) {
        <p class="notes">{{ c.notes }}</p>
      }

      <h3>Key results</h3>
      <div class="gw-table-scroll">
        <table class="gw-table" aria-label="Yields and lifetimes" data-testid="cascade-results">
          <thead>
            <tr>
              <th scope="col">Quantity</th>
              <th scope="col" class="num">Value</th>
            </tr>
          </thead>
          <tbody>
            @for (v of values(); track v.label) {
              <tr>
                <th scope="row">{{ v.label }}</th>
                <td class="num value">{{ valueText(v) }}</td>
              </tr>
            }
          </tbody>
        </table>
      </div>
      <p class="muted mc-note">{{ c.monteCarloNote }}</p>
      @if (c.dominantPathway.length > 1) {
        <p class="pathway" data-testid="dominant-pathway">
          Dominant pathway by integrated flux: {{ c.dominantPathway.join(' → ') }}.
        </p>
      }

      <h3>States</h3>
      <div class="gw-table-scroll">
        <table class="gw-table" aria-label="States">
          <thead>
            <tr>
              <th scope="col">State</th>
              <th scope="col">Kind</th>
              <th scope="col" class="num">G</th>
              <th scope="col">Energy source</th>
            </tr>
          </thead>
          <tbody>
            @for (s of c.states; track s.id) {
              <tr [attr.data-state]="s.id">
                <th scope="row" class="state">{{ s.label }}</th>
                <td>{{ kindText(s.kind) }}</td>
                <td class="num">{{ energy(s.energyEv) }}</td>
                <td class="provenance"><gw-rich-text [text]="s.source" /></td>
              </tr>
            }
          </tbody>
        </table>
      </div>

      <h3>Steps</h3>
      <div class="gw-table-scroll">
        <table class="gw-table" aria-label="Steps">
          <thead>
            <tr>
              <th scope="col">Step</th>
              <th scope="col">Type</th>
              <th scope="col" class="num">k</th>
              <th scope="col" class="num">ΔG°</th>
              <th scope="col">Regime</th>
              <th scope="col" class="num">Integrated flux</th>
              <th scope="col">Source</th>
            </tr>
          </thead>
          <tbody>
            @for (s of c.steps; track $index) {
              <tr>
                <th scope="row" class="step">{{ stateName(s.from) }} → {{ stateName(s.to) }}</th>
                <td>{{ typeText(s.type) }}</td>
                <td class="num">{{ rate(s.k) }}</td>
                <td class="num">{{ energy(s.deltaG0Ev) }}</td>
                <td>{{ regime(s.regime) }}</td>
                <td class="num">{{ num(s.flux, 2) }}</td>
                <td class="provenance"><gw-rich-text [text]="s.source" /></td>
              </tr>
            }
          </tbody>
        </table>
      </div>
      <p class="muted">
        Integrated flux: ∫k p dt of the step, the expected number of times it is taken; it can
        exceed 1 when a step runs back and forth. Reverse ET steps follow from detailed balance.
      </p>

      <h3>Warnings</h3>
      @if (c.warnings.length === 0) {
        <p class="muted">No validity warnings for this cascade.</p>
      } @else {
        <ul class="warnings">
          @for (w of c.warnings; track $index) {
            <li>⚠ <gw-rich-text [text]="w.message" /></li>
          }
        </ul>
      }
    </section>
  `,
  styleUrl: '../reports.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReportCascade {
  readonly cascade = input.required<ReportCascadeSnapshot>();

  protected readonly values = computed(() => [
    ...this.cascade().yields,
    ...this.cascade().lifetimes,
  ]);
  private readonly labels = computed(
    () => new Map(this.cascade().states.map((s) => [s.id, s.label])),
  );

  protected readonly valueText = cascadeValueText;
  protected readonly num = formatNumber;
  protected readonly rate = formatRate;
  protected readonly energy = formatEnergyEv;
  protected readonly regime = formatRegime;

  protected stateName(id: string): string {
    return this.labels().get(id) ?? id;
  }
  protected kindText(kind: string): string {
    return STATE_KIND_TEXT[kind] ?? kind;
  }
  protected typeText(type: string): string {
    return STEP_TYPE_TEXT[type] ?? type;
  }
}
