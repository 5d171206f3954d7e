import {
  formatMeasured,
  PARAMETER_KINDS,
  provenanceText,
  potentialFromShe,
  potentialScaleName,
  splitPotentialUnit,
  type PairInput,
  type PairParameter,
} from '@gapwise/contracts';
import type { Quantity } from '@gapwise/calc';
import { editableText } from '../units/number-format';
import { displayDifference, displayOf, unitLabel } from '../units/units';

export interface DiffRow {
  readonly field: string;
  readonly left: string;
  readonly right: string;
  readonly changed: boolean;
}

/**
 * A parameter as a reader sees it: value in its typed unit, σ, source. A typed value reads as
 * typed; a derived one (a helper's, a trace's, a fit's) with the digits its σ supports
 * (`formatMeasured`), since its 12 stored digits are arithmetic, not knowledge.
 */
export function describeParameter(p: PairParameter | undefined): string {
  if (!p) return '—';
  const q = PARAMETER_KINDS[p.kind].quantity as Quantity;
  // A potential typed against a reference ("V vs SCE") is stored vs SHE: show it as typed.
  const split = q === 'potential' ? splitPotentialUnit(p.unit) : null;
  const unit = split ? split.unit : p.unit;
  const typed = split?.code ? potentialFromShe(p.value, split.code) : p.value;
  const scale = split?.code ? ` vs ${potentialScaleName(split.code)}` : '';
  const shown = displayOf(typed, unit, q);
  const unitText = `${unit ? ' ' + unitLabel(unit) : ''}${scale}`;
  const sigmaEv = unit === 'nm' ? p.uncertainty : null;
  const sigmaShown =
    p.uncertainty == null || unit === 'nm' ? null : displayDifference(p.uncertainty, unit, q);
  let value: string;
  if (p.provenance.kind === 'derived') {
    value =
      sigmaShown !== null
        ? `${formatMeasured(shown, sigmaShown)}${unitText}`
        : `${formatMeasured(shown)}${unitText}`;
    if (sigmaEv !== null && sigmaEv !== undefined) value += ` ± ${formatMeasured(sigmaEv)} eV`;
  } else {
    const sigma =
      p.uncertainty == null
        ? ''
        : unit === 'nm'
          ? ` ± ${editableText(p.uncertainty)} eV`
          : ` ± ${editableText(sigmaShown)}`;
    value = `${editableText(shown)}${unitText}${sigma}`;
  }
  return `${value} (${provenanceText(p.provenance).replace(/\.$/, '')})`;
}

/** Field-by-field comparison of two states of a pair (left = older or mine, right = other). */
export function pairDifferences(left: PairInput, right: PairInput, onlyChanged = false): DiffRow[] {
  const rows: DiffRow[] = [];
  const add = (field: string, a: string, b: string) =>
    rows.push({ field, left: a, right: b, changed: a !== b });
  add('Name', left.name, right.name);
  add('Donor', left.donor, right.donor);
  add('Acceptor', left.acceptor, right.acceptor);
  add('Medium', left.medium ?? '', right.medium ?? '');
  add('Temperature', `${editableText(left.temperature)} K`, `${editableText(right.temperature)} K`);
  add('Rate model', left.model ?? 'marcus', right.model ?? 'marcus');
  add('Status', left.status ?? '', right.status ?? '');
  add('Tags', (left.tags ?? []).join(', '), (right.tags ?? []).join(', '));
  add('Notes', left.notes ?? '', right.notes ?? '');
  for (const kind of Object.keys(PARAMETER_KINDS) as Array<keyof typeof PARAMETER_KINDS>) {
    const a = left.parameters.find((p) => p.kind === kind);
    const b = right.parameters.find((p) => p.kind === kind);
    if (!a && !b) continue;
    add(PARAMETER_KINDS[kind].label, describeParameter(a), describeParameter(b));
  }
  return onlyChanged ? rows.filter((r) => r.changed) : rows;
}
