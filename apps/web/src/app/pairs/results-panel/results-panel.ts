import { Clipboard } from '@angular/cdk/clipboard';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTooltipModule } from '@angular/material/tooltip';
import { BOLTZMANN_EV_PER_K, KCAL_PER_MOL_PER_EV, KJ_PER_MOL_PER_EV } from '@gapwise/calc';
import { PARAMETER_KINDS, pairRatesView, type PairResults } from '@gapwise/contracts';
import {
  formatFixed,
  formatScientific,
  formatScientificAscii,
  formatSignificant,
} from '../../units/number-format';
import { RichText } from '../../shared/rich-text/rich-text';
import type { MonteCarloState } from './monte-carlo';
import { MonteCarloPanel } from './monte-carlo-panel';

const MODEL_NAMES: Record<string, string> = {
  marcus: 'classical nonadiabatic Marcus',
  mlj: 'Marcus–Levich–Jortner (one quantum mode)',
  mljThermal: 'thermal Marcus–Levich–Jortner (finite-temperature mode)',
  crossover: 'nonadiabatic-to-adiabatic crossover (solvent control)',
};

const FIELD_LABELS: Record<string, string> = {
  deltaG0: PARAMETER_KINDS.deltaG0.label,
  deltaG0Recombination: PARAMETER_KINDS.deltaG0Recombination.label,
  lambdaTotal: PARAMETER_KINDS.lambdaTotal.label,
  lambda: 'Reorganization energy λ (λᵢ + λₒ)',
  lambdaOuter: PARAMETER_KINDS.lambdaOuter.label,
  lambdaInner: PARAMETER_KINDS.lambdaInner.label,
  lambdaSolvent: PARAMETER_KINDS.lambdaOuter.label,
  lambdaVib: PARAMETER_KINDS.lambdaInner.label,
  coupling: PARAMETER_KINDS.coupling.label,
  hbarOmega: PARAMETER_KINDS.hbarOmega.label,
  tauL: PARAMETER_KINDS.tauL.label,
  temperature: 'Temperature',
};

/** k, log10 k, ΔG‡, regime, warnings and the Monte Carlo interval of the pair being edited. */
@Component({
  selector: 'gw-results-panel',
  imports: [MatButtonModule, MatIconModule, MatTooltipModule, MonteCarloPanel, RichText],
  templateUrl: './results-panel.html',
  styleUrl: './results-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ResultsPanel {
  /** Every problem is an input not given yet (`is needed …`), so the list is shown neutrally. */
  protected onlyMissing(): boolean {
    const errors = this.results().errors;
    return errors.length > 0 && errors.every((e) => e.message.startsWith('is needed'));
  }

  private readonly clipboard = inject(Clipboard);
  private readonly snackBar = inject(MatSnackBar);

  readonly results = input.required<PairResults>();
  readonly temperature = input<number | null>(null);
  readonly coupling = input<number | null>(null);
  readonly monteCarlo = input<MonteCarloState>({ status: 'none' });
  /** Set after a save when the server's stored results differ from the browser's. */
  readonly serverMismatch = input<string | null>(null);
  readonly serverAgrees = input(false);

  protected readonly fmtSci = formatScientific;
  protected readonly fmtFixed = formatFixed;
  protected readonly fmtSig = formatSignificant;
  protected readonly modelName = computed(
    () => MODEL_NAMES[this.results().model] ?? this.results().model,
  );

  /** k_CS beside k_CR and their ratio, in the pair model's words (as the table and the PDF). */
  protected readonly rates = computed(() => pairRatesView(this.results()));
  protected readonly recombinationErrors = computed(() =>
    (this.results().recombination?.errors ?? []).map(
      (e) => `${this.fieldLabel(e.field)} ${e.message}`,
    ),
  );

  protected readonly activation = computed(() => {
    const g = this.results().activationFreeEnergy;
    if (g === null) return null;
    return {
      eV: formatSignificant(g, 3),
      kcal: formatSignificant(g * KCAL_PER_MOL_PER_EV, 3),
      kj: formatSignificant(g * KJ_PER_MOL_PER_EV, 3),
    };
  });

  /**
   * Nuclear regime in words, with the electronic one judged from |H_AB| against k_BT (sentences
   * carry the subscript markup that `gw-rich-text` draws).
   */
  protected readonly regimeWords = computed(() => {
    const r = this.results();
    if (!r.regime) return null;
    const nuclear =
      r.regime === 'inverted'
        ? 'Inverted region (−ΔG° > λ): the rate falls as the driving force grows.'
        : r.regime === 'activationless'
          ? 'Activationless (−ΔG° ≈ λ): at the top of the Marcus curve.'
          : 'Normal region (−ΔG° < λ): more driving force, faster transfer.';
    const t = this.temperature();
    const h = Math.abs(this.coupling() ?? 0);
    const adiabaticHint = r.warnings.some((w) => /coupling-large|barrier-lowering/.test(w.code));
    const strong = !!t && h > BOLTZMANN_EV_PER_K * t;
    const electronic =
      strong && r.model === 'crossover'
        ? 'Adiabatic side (|H_AB| > k_BT): the crossover model includes the solvent-controlled limit.'
        : strong
          ? 'Adiabatic side: |H_AB| exceeds k_BT, so the golden-rule rate overestimates.'
          : adiabaticHint
            ? 'Near the adiabatic limit: see the warnings.'
            : 'Nonadiabatic: |H_AB| is well below k_BT.';
    return { nuclearCode: r.regime, couplingCode: r.couplingRegime ?? null, nuclear, electronic };
  });

  protected fieldLabel(field: string): string {
    return FIELD_LABELS[field] ?? field;
  }

  protected copy(what: 'k' | 'log10k' | 'activation'): void {
    const r = this.results();
    let text = '';
    if (what === 'k' && r.k !== null) text = `k = ${formatScientificAscii(r.k)} s^-1`;
    if (what === 'log10k' && r.log10k !== null) text = `log10(k / s^-1) = ${r.log10k.toFixed(3)}`;
    if (what === 'activation' && r.activationFreeEnergy !== null) {
      text = `ΔG‡ = ${Number(r.activationFreeEnergy.toPrecision(4))} eV`;
    }
    if (text && this.clipboard.copy(text))
      this.snackBar.open(`Copied: ${text}`, undefined, { duration: 2500 });
  }
}
