import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import { FormControl, FormGroupDirective, NgForm, ReactiveFormsModule } from '@angular/forms';
import { ErrorStateMatcher } from '@angular/material/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatSelectModule } from '@angular/material/select';
import { MatTooltipModule } from '@angular/material/tooltip';
import {
  PARAMETER_KINDS,
  PROVENANCE_KINDS,
  helperName,
  parameterPlausibility,
  plainText,
  provenanceText,
  type ParameterKind,
} from '@gapwise/contracts';
import type { Quantity } from '@gapwise/calc';
import { RichText } from '../../shared/rich-text/rich-text';
import { unitLabel, unitsFor } from '../../units/units';
import type { ParameterGroup } from '../pair-form/pair-form';
import { parameterSpec } from '../pair-form/pair-form';
import {
  confirmQuantity,
  switchQuantityUnit,
  typeQuantityText,
  typeUncertaintyText,
  type UnitChange,
} from '../pair-form/quantity-control';
import { ReferencePicker } from '../reference-picker/reference-picker';
import { UnitChangeNote } from '../unit-change-note/unit-change-note';

/** Shows a field's error as soon as it is edited, not only after leaving it. */
class EditedErrorMatcher implements ErrorStateMatcher {
  isErrorState(control: FormControl | null, form: FormGroupDirective | NgForm | null): boolean {
    return !!control && control.invalid && (control.dirty || control.touched || !!form?.submitted);
  }
}

export interface DerivationChoice {
  readonly id: string;
  readonly label: string;
}

const PROVENANCE_WORDS: Record<string, string> = {
  measured: 'Measured',
  computed: 'Computed',
  literature: 'Literature',
  derived: 'Derived',
  assumed: 'Assumed',
};

/**
 * One pair parameter: value in a unit of its quantity, uncertainty, provenance with citation
 * and note. A typed value not yet confirmed (Enter, a save, a helper) takes the unit picked
 * next; a confirmed one is converted; either way a note says what happened, with Undo.
 */
@Component({
  selector: 'gw-parameter-field',
  imports: [
    ReactiveFormsModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    MatTooltipModule,
    RichText,
    UnitChangeNote,
    ReferencePicker,
  ],
  templateUrl: './parameter-field.html',
  styleUrl: './parameter-field.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '[attr.data-kind]': 'kind()' },
})
export class ParameterField {
  readonly group = input.required<ParameterGroup>();
  readonly kind = input.required<ParameterKind>();
  readonly readonly = input(false);
  readonly derivations = input<readonly DerivationChoice[]>([]);
  /** A problem the calculation found with this input (shown under the field). */
  readonly calcError = input<string | null>(null);

  readonly deriveRequested = output<string>();
  /** Fired on every keystroke or unit change that may change the value. */
  readonly edited = output<void>();

  protected readonly errorMatcher = new EditedErrorMatcher();
  protected readonly provenanceKinds = PROVENANCE_KINDS;
  protected readonly provenanceWords = PROVENANCE_WORDS;
  protected readonly unitLabel = unitLabel;
  protected readonly spec = computed(() => parameterSpec(this.kind()));
  /** The label with its subscript markup (`|H_AB|`), drawn by `gw-rich-text`. */
  protected readonly label = computed(() => PARAMETER_KINDS[this.kind()].label);
  /** The same label as plain text (`|HAB|`) for aria-labels. */
  protected readonly plainLabel = computed(() => plainText(this.label()));
  protected readonly units = computed(() =>
    unitsFor(PARAMETER_KINDS[this.kind()].quantity as Quantity),
  );
  protected readonly fieldId = computed(() => `param-${this.kind()}`);
  protected readonly isPotential = computed(
    () => PARAMETER_KINDS[this.kind()].quantity === 'potential',
  );

  /** What the last unit change did, shown for a moment under the field. */
  protected readonly unitChange = signal<UnitChange | null>(null);

  protected typeValue(text: string): void {
    typeQuantityText(this.group(), this.spec(), text);
    this.unitChange.set(null);
    this.edited.emit();
  }

  /** Enter commits the typed value: a later unit change converts it. */
  protected confirmValue(): void {
    confirmQuantity(this.group());
  }

  protected unitUndone(): void {
    this.edited.emit();
  }

  /** VALIDATION.md B9–B11/B16: an unusual value is kept and flagged, never refused. */
  protected warning(): string | null {
    const g = this.group();
    const v = g.controls.value.value;
    if (v === null || g.controls.text.invalid) return null;
    return parameterPlausibility(this.kind(), v, g.controls.unit.value);
  }

  protected typeUncertainty(text: string): void {
    typeUncertaintyText(this.group(), this.spec(), text);
    this.edited.emit();
  }

  /** The number keeps its meaning on the newly picked reference (it is typed against it). */
  protected pickReference(code: string): void {
    this.group().controls.reference.setValue(code);
    this.edited.emit();
  }

  protected switchUnit(unit: string): void {
    this.unitChange.set(switchQuantityUnit(this.group(), this.spec(), unit));
    this.edited.emit();
  }

  protected errorOf(control: FormControl<string>): string | null {
    const e = control.errors;
    if (!e) return null;
    const first = e['required'] ?? e['number'] ?? e['rule'] ?? e['api'];
    if (typeof first !== 'string') return null;
    return e['rule'] && !/^[A-Z]/.test(first) ? `${this.label()} ${first}` : first;
  }

  /** The derived value's provenance as the report prints it (tooltip: text only). */
  protected derivedSentence(): string {
    const p = this.group().controls.provenance.getRawValue();
    return plainText(
      provenanceText({
        kind: p.kind,
        citation: p.citation || null,
        note: p.note || null,
        methodId: p.methodId,
        methodInputs: p.methodInputs,
        sources: p.sources,
      }),
    );
  }

  protected helperName(methodId: string): string {
    return helperName(methodId);
  }
}
