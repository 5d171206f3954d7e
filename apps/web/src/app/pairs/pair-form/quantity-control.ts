import {
  AbstractControl,
  FormControl,
  FormGroup,
  ValidationErrors,
  ValidatorFn,
} from '@angular/forms';
import type { Quantity } from '@gapwise/calc';
import { roundMeasured } from '@gapwise/contracts';
import { editableText, parseStrictNumber } from '../../units/number-format';
import {
  canonicalDifference,
  canonicalOf,
  displayDifference,
  displayOf,
  unitLabel,
} from '../../units/units';

/** Domain rule on the canonical value; returns the reason when refused. */
export type ValueRule = (canonical: number) => string | null;

/**
 * A dimensioned number as the user sees it (`text` in `unit`) and as it is stored (`value`,
 * canonical). The canonical value is the truth for a *confirmed* value: switching the unit
 * rewrites the text from it, so eV → kcal/mol → eV shows exactly what was typed.
 *
 * `pending` is true while the text was typed and not yet confirmed. A value is confirmed when
 * it was loaded (a saved version, a default, a pre-filled helper input), put in by a helper, or
 * committed with Enter. A pending value takes the unit picked next (type 25, pick °C: 25 °C);
 * a confirmed one is converted (25 K → −248.15 °C). Either way `switchQuantityUnit` says what
 * happened and how to undo it.
 *
 * `rounded` is true while the text shows a derived value (from a helper, or stored as derived)
 * rounded to the digits its uncertainty supports; `value` keeps the full number, which is saved.
 * Typing clears it; a unit change keeps the rounding in the new unit.
 */
export type QuantityGroup = FormGroup<{
  text: FormControl<string>;
  unit: FormControl<string>;
  value: FormControl<number | null>;
  uncertaintyText: FormControl<string>;
  uncertainty: FormControl<number | null>;
  pending: FormControl<boolean>;
  rounded: FormControl<boolean>;
}>;

export interface QuantitySpec {
  readonly label: string;
  readonly quantity: Quantity;
  readonly rule?: ValueRule;
  /** A plausibility check on the canonical value: warns, never refuses. */
  readonly warn?: ValueRule;
  readonly required?: boolean;
}

/** What a unit change did to the field, for the note shown under it, and how to undo it. */
export interface UnitChange {
  /** `reread`: the typed number kept and read in the new unit; `converted`: same quantity. */
  readonly mode: 'reread' | 'converted';
  /** "25 K → −248.15 °C" or "25 is now read as 25 °C (= 298.15 K)". */
  readonly message: string;
  readonly undo: () => void;
}

function numberValidator(
  spec: QuantitySpec,
  unit: () => string,
  canBeEmpty: boolean,
  isUncertainty: boolean,
): ValidatorFn {
  return (control: AbstractControl<string>): ValidationErrors | null => {
    const text = (control.value ?? '').trim();
    if (text === '') return canBeEmpty ? null : { required: `${spec.label} is required.` };
    if (/^[+-]?\d+,\d+/.test(text)) {
      return {
        number: `${spec.label}: use a decimal point, not a comma (${text.replace(',', '.')}).`,
      };
    }
    const parsed = parseStrictNumber(text);
    if (parsed === null)
      return { number: `${spec.label} is not a finite number (examples: 0.35, −1.2e-3).` };
    if (isUncertainty) {
      if (parsed < 0) return { rule: 'An uncertainty cannot be negative.' };
      // A spread of wavelengths is not a spread of energies (E ∝ 1/λ): ask for it in eV.
      if (unit() === 'nm' && spec.quantity === 'photonEnergy')
        return { rule: `Give the uncertainty of ${spec.label} in eV, not nm.` };
      return null;
    }
    if (spec.rule) {
      const reason = spec.rule(canonicalOf(parsed, unit(), spec.quantity));
      if (reason) return { rule: reason };
    }
    return null;
  };
}

export function createQuantityGroup(
  spec: QuantitySpec,
  initial: {
    value: number | null;
    unit: string;
    uncertainty?: number | null;
    /** Show the value rounded to what its uncertainty supports (a derived value). */
    rounded?: boolean;
  },
): QuantityGroup {
  const unit = new FormControl(initial.unit, { nonNullable: true });
  const rounded = !!initial.rounded && initial.value !== null;
  const group: QuantityGroup = new FormGroup({
    text: new FormControl(
      initial.value === null
        ? ''
        : shownText(
            initial.value,
            initial.uncertainty ?? null,
            initial.unit,
            spec.quantity,
            rounded,
          ),
      {
        nonNullable: true,
        validators: numberValidator(spec, () => unit.value, !spec.required, false),
      },
    ),
    unit,
    value: new FormControl<number | null>(initial.value),
    uncertaintyText: new FormControl(
      initial.uncertainty == null
        ? ''
        : initial.unit === 'nm'
          ? '' // a σ never stands in nm (see the validator); only an API client could send one
          : editableText(displayDifference(initial.uncertainty, initial.unit, spec.quantity)),
      { nonNullable: true, validators: numberValidator(spec, () => unit.value, true, true) },
    ),
    uncertainty: new FormControl<number | null>(initial.uncertainty ?? null),
    pending: new FormControl(false, { nonNullable: true }),
    rounded: new FormControl(rounded, { nonNullable: true }),
  });
  return group;
}

/**
 * The field's text for a canonical value: as stored (12 figures), or, when derived, rounded in
 * the canonical unit to what σ supports (`roundMeasured`) and then shown in the field's unit
 * (77 K stays −196.15 °C; −0.683425360906 eV reads −0.6834 eV).
 */
function shownText(
  canonical: number,
  canonicalSigma: number | null,
  unit: string,
  quantity: Quantity,
  rounded: boolean,
): string {
  if (!rounded) return editableText(displayOf(canonical, unit, quantity));
  const display = displayOf(roundMeasured(canonical, canonicalSigma), unit, quantity);
  return editableText(Number(display.toPrecision(6)));
}

/** The user committed the value (Enter): a later unit change converts it. */
export function confirmQuantity(group: QuantityGroup): void {
  group.controls.pending.setValue(false);
}

/** The plausibility warning for the current value, if any (the value is still accepted). */
export function quantityWarning(group: QuantityGroup, spec: QuantitySpec): string | null {
  const v = group.controls.value.value;
  if (v === null || !spec.warn || group.controls.text.invalid) return null;
  return spec.warn(v);
}

function shown(text: string, unit: string): string {
  const label = unitLabel(unit);
  return `${text.trim().replace(/^-/, '−')}${label ? ' ' + label : ''}`;
}

/** The user typed `text`: keep it, and store its canonical value (null when empty or invalid). */
export function typeQuantityText(group: QuantityGroup, spec: QuantitySpec, text: string): void {
  group.controls.text.setValue(text);
  group.controls.pending.setValue(true);
  group.controls.rounded.setValue(false);
  const parsed = group.controls.text.valid ? parseStrictNumber(text) : null;
  group.controls.value.setValue(
    parsed === null ? null : canonicalOf(parsed, group.controls.unit.value, spec.quantity),
  );
}

export function typeUncertaintyText(group: QuantityGroup, spec: QuantitySpec, text: string): void {
  group.controls.uncertaintyText.setValue(text);
  const parsed = group.controls.uncertaintyText.valid ? parseStrictNumber(text) : null;
  group.controls.uncertainty.setValue(
    parsed === null || text.trim() === '' || !group.controls.uncertaintyText.valid
      ? null
      : canonicalDifference(parsed, group.controls.unit.value, spec.quantity),
  );
}

/**
 * Picks another unit. A pending (typed, unconfirmed) value keeps its number and is read in the
 * new unit; a confirmed value is converted. Invalid text is left as typed (its meaning in the
 * new unit is re-read, so the error message stays honest). Returns what happened, or null when
 * the field is empty or the unit did not change.
 */
export function switchQuantityUnit(
  group: QuantityGroup,
  spec: QuantitySpec,
  unit: string,
): UnitChange | null {
  const { value, uncertainty, text, uncertaintyText, pending, rounded } = group.controls;
  const before = {
    unit: group.controls.unit.value,
    text: text.value,
    value: value.value,
    uncertaintyText: uncertaintyText.value,
    uncertainty: uncertainty.value,
    pending: pending.value,
    rounded: rounded.value,
  };
  if (before.unit === unit) return null;
  group.controls.unit.setValue(unit);
  const undo = () => {
    group.controls.unit.setValue(before.unit);
    text.setValue(before.text);
    value.setValue(before.value);
    uncertaintyText.setValue(before.uncertaintyText);
    uncertainty.setValue(before.uncertainty);
    pending.setValue(before.pending);
    rounded.setValue(before.rounded);
  };
  if (before.pending || value.value === null) {
    // Re-read the typed text (and its uncertainty) in the new unit.
    typeQuantityText(group, spec, text.value);
    typeUncertaintyText(group, spec, uncertaintyText.value);
    pending.setValue(before.pending);
    rounded.setValue(before.rounded);
    if (value.value === null || text.value.trim() === '') return null;
    const canonicalUnit = spec.quantity === 'temperature' ? 'K' : '';
    const echo =
      canonicalUnit && canonicalUnit !== unit
        ? ` (= ${shown(editableText(Number(value.value.toPrecision(10))), canonicalUnit)})`
        : '';
    return {
      mode: 'reread',
      message: `${text.value.trim().replace(/^-/, '−')} is now read as ${shown(text.value, unit)}${echo}`,
      undo,
    };
  }
  text.setValue(shownText(value.value, uncertainty.value, unit, spec.quantity, rounded.value));
  if (uncertainty.value !== null) {
    if (unit === 'nm' && spec.quantity === 'photonEnergy') {
      // No wavelength spread stands for an energy spread: the σ text stays and is flagged.
      uncertaintyText.updateValueAndValidity();
    } else {
      uncertaintyText.setValue(
        editableText(displayDifference(uncertainty.value, unit, spec.quantity)),
      );
    }
  }
  return {
    mode: 'converted',
    message: `${shown(before.text, before.unit)} → ${shown(text.value, unit)}`,
    undo,
  };
}

/**
 * Puts a canonical value (e.g. from a derivation) into the group, shown in its current unit with
 * the digits it supports (`shownText`); the full value is kept and saved.
 */
export function setCanonicalQuantity(
  group: QuantityGroup,
  spec: QuantitySpec,
  canonical: number,
): void {
  const unit = group.controls.unit.value;
  const sigma = group.controls.uncertainty.value;
  group.controls.value.setValue(canonical);
  group.controls.pending.setValue(false);
  group.controls.rounded.setValue(true);
  group.controls.text.setValue(shownText(canonical, sigma, unit, spec.quantity, true));
  group.controls.text.markAsDirty();
}

/** "0.35 eV ≈ 8.07 kcal/mol"-style echo of the canonical value, for the hint under the field. */
export function canonicalEcho(value: number | null, canonicalUnit: string): string {
  if (value === null) return '';
  return `= ${editableText(value)} ${unitLabel(canonicalUnit)}`.trim();
}
