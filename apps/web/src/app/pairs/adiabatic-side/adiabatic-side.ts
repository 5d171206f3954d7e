import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { calculate } from '@gapwise/calc';
import { RichText } from '../../shared/rich-text/rich-text';
import { formatScientific, formatSignificant } from '../../units/number-format';

interface Rates {
  readonly kappa: string | null;
  readonly gamma: string | null;
  readonly kLz: string | null;
  readonly barrier: string | null;
  readonly barrierApproximate: string | null;
  readonly barrierDiabatic: string | null;
  readonly kAdiabatic: string | null;
  /** Why the adiabatic barrier was refused (Robin–Day class III: no barrier). */
  readonly refused: string | null;
}

/**
 * For strongly coupled pairs (coupling regime intermediate or adiabatic, CALC-API.md) the
 * golden-rule rate overestimates: this card shows, beside it, the Landau–Zener transmission κ_el
 * with its rate (`rate.landauZener`) and the exact barrier of the two-state adiabatic surfaces
 * (`evb.adiabaticBarrier`) with the adiabatic TST rate, both at ν_n = 10¹³ s⁻¹ (SCIENCE.md §3).
 */
@Component({
  selector: 'gw-adiabatic-side',
  imports: [RichText],
  template: `
    @if (rates(); as r) {
      <section class="adiabatic" aria-labelledby="adiabatic-h">
        <h2 id="adiabatic-h">Adiabatic side ({{ regime() }} coupling)</h2>
        <p class="why">
          The golden-rule rate overestimates here. With a nuclear frequency ν<sub>n</sub> = 10¹³
          s⁻¹:
        </p>
        <dl>
          @if (r.kappa) {
            <dt>Landau–Zener κ<sub>el</sub></dt>
            <dd class="kappa">
              {{ r.kappa }} <span class="alt">(γ = {{ r.gamma }})</span>
            </dd>
            <dt>k = κ<sub>el</sub> ν<sub>n</sub> exp(−ΔG‡/k<sub>B</sub>T)</dt>
            <dd class="k-lz">{{ r.kLz }} s⁻¹</dd>
          }
          @if (r.refused) {
            <dt>No barrier, no rate</dt>
            <dd class="refused"><gw-rich-text [text]="r.refused" /></dd>
          } @else if (r.barrier) {
            <dt>Adiabatic barrier ΔG‡<sub>ad</sub> (exact, two-state surfaces)</dt>
            <dd class="barrier">
              {{ r.barrier }} eV
              <span class="alt"
                >(closed form {{ r.barrierApproximate }} eV; diabatic
                {{ r.barrierDiabatic }} eV)</span
              >
            </dd>
            <dt>k = ν<sub>n</sub> exp(−ΔG‡<sub>ad</sub>/k<sub>B</sub>T)</dt>
            <dd class="k-ad">{{ r.kAdiabatic }} s⁻¹</dd>
          }
        </dl>
      </section>
    }
  `,
  styleUrl: './adiabatic-side.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AdiabaticSide {
  /** `couplingRegime` of the pair's results; the card shows only for intermediate/adiabatic. */
  readonly regime = input<string | null>(null);
  readonly deltaG0 = input<number | null>(null);
  readonly lambda = input<number | null>(null);
  readonly coupling = input<number | null>(null);
  readonly temperature = input<number | null>(null);

  protected readonly rates = computed<Rates | null>(() => {
    const regime = this.regime();
    if (regime !== 'intermediate' && regime !== 'adiabatic') return null;
    const [deltaG0, lambda, coupling, temperature] = [
      this.deltaG0(),
      this.lambda(),
      this.coupling(),
      this.temperature(),
    ];
    if (deltaG0 === null || lambda === null || coupling === null || temperature === null)
      return null;
    const inputs = { deltaG0, lambda, coupling, temperature };
    const lz = calculate({ method: 'rate.landauZener', inputs });
    const o = lz.ok ? lz.outputs : null;
    const ad = calculate({ method: 'evb.adiabaticBarrier', inputs });
    const b = ad.ok ? ad.outputs : null;
    // Refusals (class III: 2|H| ≥ λ) are said once, in the core's words.
    const refusals = [
      ...new Set([lz, ad].flatMap((a) => (a.ok ? [] : a.errors.map((e) => e.message)))),
    ];
    return {
      kappa: o ? formatSignificant(o.transmission, 3) : null,
      gamma: o ? formatSignificant(o.gamma, 3) : null,
      kLz: o ? formatScientific(o.k, 3) : null,
      barrier: b ? formatSignificant(b.barrier, 3) : null,
      barrierApproximate: b ? formatSignificant(b.barrierApproximate, 3) : null,
      barrierDiabatic: b ? formatSignificant(b.barrierDiabatic, 3) : null,
      kAdiabatic: b ? formatScientific(b.k, 3) : null,
      refused: refusals.length ? refusals.join(' ') : null,
    };
  });
}
