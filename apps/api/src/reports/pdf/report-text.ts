/**
 * The strings a report prints, built from a snapshot: shared by the PDF renderer and the CSV
 * export so both say the same thing. Formatting of numbers lives in `@gapwise/contracts`.
 */
import {
  displayUnit,
  formatEnergyEv,
  formatLog10,
  formatNumber,
  formatInputQuantity,
  formatRate,
  formatRegime,
  formatUncertainty,
  intervalText,
  modelName,
  provenanceText,
  snapshotRatesView,
  snapshotSource,
  totalLambdaEv,
  type PairStepView,
  type ReportInput,
  type ReportModelResult,
  type ReportPairSnapshot,
} from '@gapwise/contracts';

export { modelName, provenanceText };

/** "−6.918 kcal/mol" — the value as the user typed it. */
export function typedText(input: ReportInput): string {
  return formatInputQuantity(input.typedValue, input.typedUnit);
}

/** "−0.3 eV" — canonical value. */
export function canonicalText(input: ReportInput): string {
  // Converted from another unit: 5 significant figures, not the conversion's float noise.
  const converted = input.typedUnit !== input.canonicalUnit;
  return formatInputQuantity(input.value, input.canonicalUnit, converted ? 5 : 6);
}

export function uncertaintyText(input: ReportInput): string {
  return formatUncertainty(input.uncertainty, input.canonicalUnit);
}

/** Row of the inputs table: parameter, as typed, canonical, uncertainty, provenance. */
export function inputRow(input: ReportInput): string[] {
  return [
    input.label,
    typedText(input),
    canonicalText(input),
    uncertaintyText(input),
    provenanceText(input.provenance),
  ];
}

export { intervalText };

/** Row of the results table. */
export function resultRow(result: ReportModelResult, hasUncertainties = false): string[] {
  return [
    modelName(result.model) + (result.primary ? ' (chosen)' : ''),
    formatRate(result.k),
    formatLog10(result.log10k),
    formatEnergyEv(result.activationFreeEnergy),
    formatRegime(result.regime),
    formatRegime(result.couplingRegime ?? null),
    intervalText(result, hasUncertainties),
  ];
}

/** Whether any input of the pair states an uncertainty. */
export function hasUncertainties(pair: ReportPairSnapshot): boolean {
  return pair.inputs.some((i) => i.uncertainty !== null && i.uncertainty > 0);
}

/** The canonical value of one input kind, or null. */
export function inputValue(pair: ReportPairSnapshot, kind: string): number | null {
  return pair.inputs.find((i) => i.kind === kind)?.value ?? null;
}

/** Total λ of the pair model (entered total, or λᵢ + λₒ), or null. */
export function totalLambda(pair: ReportPairSnapshot): number | null {
  return totalLambdaEv(pair.inputs);
}

export { snapshotSource as sourceOf };

/**
 * Charge separation beside charge recombination (rows: step, model, k, log10 k, regime) and the
 * sentence comparing them; null when the snapshot has no recombination (no ΔG°_CR, or frozen
 * before it was reported). The strings are the pair model's, as on the pair page.
 */
export function stepsText(
  pair: ReportPairSnapshot,
): { rows: string[][]; ratio: string | null; note: string } | null {
  const cr = pair.recombination;
  const view = snapshotRatesView(pair);
  if (!cr || !view) return null;
  const row = (step: string, v: PairStepView) => [step, v.model, v.rate, v.log10k, v.regime];
  return {
    rows: [
      row('Charge separation k_CS', view.separation),
      row('Charge recombination k_CR', view.recombination ?? view.separation),
    ],
    ratio: view.ratio,
    note: cr.note,
  };
}

export function primaryResult(pair: ReportPairSnapshot): ReportModelResult | null {
  return pair.results.find((r) => r.primary) ?? null;
}

/** Row of a comparison table. */
export function comparisonRow(pair: ReportPairSnapshot): string[] {
  const r = primaryResult(pair);
  const energy = (v: number | null) => (v === null ? '—' : `${formatNumber(v, 3)} eV`);
  const h = inputValue(pair, 'coupling');
  return [
    `${pair.name} (v${pair.pairVersion})`,
    energy(inputValue(pair, 'deltaG0')),
    energy(totalLambda(pair)),
    h === null ? '—' : `${formatNumber(Math.abs(h), 3)} eV`,
    `${formatNumber(pair.temperatureK, 5)} ${displayUnit('K')}`,
    modelName(pair.model),
    formatRate(r?.k ?? null),
    formatLog10(r?.log10k ?? null),
    formatRegime(r?.regime ?? null),
  ];
}
