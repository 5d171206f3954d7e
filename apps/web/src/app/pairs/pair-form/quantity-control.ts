import {
  AbstractControl,
  FormControl,
  FormGroup,
  ValidationErrors,
  ValidatorFn,
} from '@angular/forms';
import type { Quantity } from '@gapwise/calc';
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
 * canonical). The canonical value is the truth: switching the unit rewrites the text from it,
 * so eV → kcal/mol → eV shows exactly what was typed (no drift from re-parsing rounded text).
 */
export type QuantityGroup = FormGroup<{
  text: FormControl<string>;
  unit: FormControl<string>;
  value: FormControl<number | null>;
  uncertaintyText: FormControl<string>;
  uncertainty: FormControl<number | null>;
}>;

export interface QuantitySpec {
  readonly label: string;
  readonly quantity: Quantity;
  readonly rule?: ValueRule;
  readonly required?: boolean;
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
    if (isUncertainty) return parsed < 0 ? { rule: 'An uncertainty cannot be negative.' } : null;
    if (spec.rule) {
      const reason = spec.rule(canonicalOf(parsed, unit(), spec.quantity));
      if (reason) return { rule: reason };
    }
    return null;
  };
}

export function createQuantityGroup(
  spec: QuantitySpec,
  initial: { value: number | null; unit: string; uncertainty?: number | null },
): QuantityGroup {
  const unit = new FormControl(initial.unit, { nonNullable: true });
  const group: QuantityGroup = new FormGroup({
    text: new FormControl(
      initial.value === null
        ? ''
        : editableText(displayOf(initial.value, initial.unit, spec.quantity)),
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
        : editableText(displayDifference(initial.uncertainty, initial.unit, spec.quantity)),
      { nonNullable: true, validators: numberValidator(spec, () => unit.value, true, true) },
    ),
    uncertainty: new FormControl<number | null>(initial.uncertainty ?? null),
  });
  return group;
}

/** The user typed `text`: keep it, and store its canonical value (null when empty or invalid). */
export function typeQuantityText(group: QuantityGroup, spec: QuantitySpec, text: string): void {
  group.controls.text.setValue(text);
  const parsed = group.controls.text.valid ? parseStrictNumber(text) : null;
  group.controls.value.setValue(
    parsed === null ? null : canonicalOf(parsed, group.controls.unit.value, spec.quantity),
  );
}

export function typeUncertaintyText(group: QuantityGroup, spec: QuantitySpec, text: string): void {
  group.controls.uncertaintyText.setValue(text);
  const parsed = group.controls.uncertaintyText.valid ? parseStrictNumber(text) : null;
  group.controls.uncertainty.setValue(
    parsed === null || text.trim() === ''
      ? null
      : canonicalDifference(parsed, group.controls.unit.value, spec.quantity),
  );
}

/**
 * Shows the same canonical value in another unit. Invalid text is left as typed (its meaning
 * in the new unit is re-read, so the error message stays honest).
 */
export function switchQuantityUnit(group: QuantityGroup, spec: QuantitySpec, unit: string): void {
  const { value, uncertainty, text, uncertaintyText } = group.controls;
  group.controls.unit.setValue(unit);
  if (value.value !== null) {
    text.setValue(editableText(displayOf(value.value, unit, spec.quantity)));
  } else {
    text.updateValueAndValidity();
  }
  if (uncertainty.value !== null) {
    uncertaintyText.setValue(
      editableText(displayDifference(uncertainty.value, unit, spec.quantity)),
    );
  }
}

/** Puts a canonical value (e.g. from a derivation) into the group, shown in its current unit. */
export function setCanonicalQuantity(
  group: QuantityGroup,
  spec: QuantitySpec,
  canonical: number,
): void {
  group.controls.value.setValue(canonical);
  group.controls.text.setValue(
    editableText(displayOf(canonical, group.controls.unit.value, spec.quantity)),
  );
  group.controls.text.markAsDirty();
}

/** "0.35 eV ≈ 8.07 kcal/mol"-style echo of the canonical value, for the hint under the field. */
export function canonicalEcho(value: number | null, canonicalUnit: string): string {
  if (value === null) return '';
  return `= ${editableText(value)} ${unitLabel(canonicalUnit)}`.trim();
}
