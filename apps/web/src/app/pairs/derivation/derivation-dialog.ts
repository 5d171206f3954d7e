import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatCheckboxModule } from '@angular/material/checkbox';
import {
  calculate,
  findMethod,
  potentialScaleLabel,
  type PotentialScale,
  type CalcAnswer,
  type InputSpec,
  type Quantity,
} from '@gapwise/calc';
import {
  PARAMETER_KINDS,
  parameterPlausibility,
  plainText,
  potentialScaleOf,
} from '@gapwise/contracts';
import { RichText } from '../../shared/rich-text/rich-text';
import { editableText, formatSignificant, parseStrictNumber } from '../../units/number-format';
import { displayOf, unitLabel, unitsFor } from '../../units/units';
import {
  QuantityGroup,
  createQuantityGroup,
  switchQuantityUnit,
  typeQuantityText,
  type UnitChange,
} from '../pair-form/quantity-control';
import { UnitChangeNote } from '../unit-change-note/unit-change-note';
import type { Derivation } from './derivations';

export interface DerivationDialogData {
  readonly derivation: Derivation;
  /** Current pair values for the pre-filled inputs: canonical value and typed unit. */
  readonly prefill: Readonly<
    Record<
      string,
      { value: number; unit: string; /** Potentials: scale code. */ reference?: string }
    >
  >;
  /** Unit the target parameter is shown in (for the preview). */
  readonly targetUnit: string;
}

export interface DerivationResult {
  readonly methodId: string;
  /** The inputs exactly as sent: numbers with the unit typed (or bare numbers / strings). */
  readonly methodInputs: Record<string, unknown>;
  /** Canonical values for the target and any further parameters. */
  readonly values: ReadonlyArray<{
    readonly kind: keyof typeof PARAMETER_KINDS;
    readonly value: number;
  }>;
}

interface InputRow {
  readonly spec: InputSpec;
  readonly label: string;
  /** A pre-filled potential's reference electrode, sent with it so the core converts. */
  readonly scale: PotentialScale | null;
  readonly units: readonly string[];
  readonly group: QuantityGroup | null;
  readonly textControl: FormControl<string> | null;
}

function labelOf(spec: InputSpec): string {
  return spec.description.replace(/\.$/, '');
}

/** Runs one derivation method on typed inputs and hands back the value with its provenance. */
@Component({
  selector: 'gw-derivation-dialog',
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatCheckboxModule,
    RichText,
    UnitChangeNote,
  ],
  templateUrl: './derivation-dialog.html',
  styleUrl: './derivation-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DerivationDialog {
  protected readonly data = inject<DerivationDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<DerivationDialog, DerivationResult>>(MatDialogRef);

  protected readonly unitLabel = unitLabel;
  protected readonly plain = plainText;
  protected readonly method = findMethod(this.data.derivation.methodId);
  protected readonly rows: InputRow[] = (this.method?.inputs ?? []).map((spec) =>
    this.rowFor(spec),
  );
  protected readonly answer = signal<CalcAnswer | null>(null);
  protected readonly targetLabel = PARAMETER_KINDS[this.data.derivation.target].label;

  protected readonly preview = computed(() => {
    const a = this.answer();
    if (!a?.ok) return null;
    const v = a.outputs[this.data.derivation.output];
    if (typeof v !== 'number') return null;
    const unit = this.data.targetUnit;
    const shown = unit ? displayOf(v, unit, 'energy') : v;
    return {
      canonical: v,
      text: `${formatSignificant(shown, 4)} ${unitLabel(unit)}`,
      eV: `${formatSignificant(v, 4)} eV`,
    };
  });
  /**
   * What looks wrong with the result, with the same ranges as the pair fields (VALIDATION.md
   * B9–B11, B16): for the target and every further parameter this run would fill.
   */
  protected readonly implausible = computed(() => {
    const a = this.answer();
    const p = this.preview();
    if (!a?.ok || !p) return [];
    const found = [
      parameterPlausibility(this.data.derivation.target, p.canonical, this.data.targetUnit),
    ];
    for (const extra of this.data.derivation.alsoFills ?? []) {
      const v = a.outputs[extra.output];
      if (typeof v === 'number') found.push(parameterPlausibility(extra.kind, v, 'eV'));
    }
    return found.filter((m): m is string => m !== null);
  });
  /** The user read the plausibility warning and takes the value anyway. */
  protected readonly override = signal(false);
  protected readonly canUse = computed(
    () => this.preview() !== null && (this.implausible().length === 0 || this.override()),
  );
  /** The last unit change of each input (what happened, with Undo), by input name. */
  protected readonly unitChanges = signal<Readonly<Record<string, UnitChange | null>>>({});

  protected readonly errors = computed(() => {
    const a = this.answer();
    return a && !a.ok ? a.errors : [];
  });

  constructor() {
    this.recompute();
  }

  private rowFor(spec: InputSpec): InputRow {
    const d = this.data.derivation;
    const units = unitsFor(spec.quantity);
    if (spec.quantity === 'string') {
      return {
        spec,
        label: labelOf(spec),
        scale: null,
        units,
        group: null,
        textControl: new FormControl('', { nonNullable: true }),
      };
    }
    const pre = d.prefill[spec.name] ? this.data.prefill[spec.name] : undefined;
    const unit =
      pre?.unit && units.includes(pre.unit)
        ? pre.unit
        : (d.defaultUnits?.[spec.name] ?? units[0] ?? '');
    const value = pre?.value ?? (typeof spec.defaultValue === 'number' ? spec.defaultValue : null);
    const group = createQuantityGroup(
      { label: labelOf(spec), quantity: spec.quantity as Quantity, required: spec.required },
      { value, unit },
    );
    const scale = pre?.reference ? potentialScaleOf(pre.reference) : null;
    const label = scale ? `${labelOf(spec)} vs ${potentialScaleLabel(scale)}` : labelOf(spec);
    return { spec, label, scale, units, group, textControl: null };
  }

  protected typeInput(row: InputRow, text: string): void {
    if (row.group)
      typeQuantityText(row.group, { label: row.label, quantity: row.spec.quantity }, text);
    else row.textControl?.setValue(text);
    this.setUnitChange(row.spec.name, null);
    this.recompute();
  }

  protected setUnitChange(name: string, change: UnitChange | null): void {
    this.unitChanges.update((all) => ({ ...all, [name]: change }));
  }

  protected unitUndone(): void {
    this.recompute();
  }

  protected switchUnit(row: InputRow, unit: string): void {
    if (!row.group) return;
    if (this.data.derivation.sharedUnit) {
      for (const r of this.rows) {
        if (r.group && r.spec.quantity === row.spec.quantity) {
          this.setUnitChange(
            r.spec.name,
            switchQuantityUnit(r.group, { label: r.label, quantity: r.spec.quantity }, unit),
          );
        }
      }
    } else {
      this.setUnitChange(
        row.spec.name,
        switchQuantityUnit(row.group, { label: row.label, quantity: row.spec.quantity }, unit),
      );
    }
    this.recompute();
  }

  /** The request inputs as the user typed them: `{ value, unit }`, bare numbers or strings. */
  private typedInputs(): Record<string, unknown> {
    const inputs: Record<string, unknown> = {};
    for (const row of this.rows) {
      if (row.textControl) {
        if (row.textControl.value.trim()) inputs[row.spec.name] = row.textControl.value.trim();
        continue;
      }
      const g = row.group!;
      const text = g.controls.text.value.trim();
      if (text === '') continue;
      const typed = parseStrictNumber(text);
      const unit = g.controls.unit.value;
      // Invalid text is sent as is: the core names the field and the reason.
      const value = typed ?? text;
      // A potential typed against a reference goes with it: the core converts (and warns when the
      // two potentials are on different scales).
      inputs[row.spec.name] = row.scale
        ? { value, unit, ...row.scale }
        : unit
          ? { value, unit }
          : value;
    }
    return inputs;
  }

  private recompute(): void {
    if (!this.method) return;
    this.answer.set(calculate({ method: this.method.id, inputs: this.typedInputs() }));
    // A new result needs its own look before an override.
    this.override.set(false);
  }

  protected errorFor(row: InputRow): string | null {
    const own = row.group?.controls.text.errors;
    if (own && row.group?.controls.text.dirty) {
      const m = own['required'] ?? own['number'] ?? own['rule'];
      if (typeof m === 'string') return m;
    }
    const fromCore = this.errors().find((e) => e.field === row.spec.name);
    return fromCore ? this.withLabels(fromCore.message) : null;
  }

  protected otherErrors(): string[] {
    const names = new Set(this.rows.map((r) => r.spec.name));
    return this.errors()
      .filter((e) => !names.has(e.field))
      .map((e) => this.withLabels(e.message));
  }

  protected warnings(): string[] {
    const a = this.answer();
    return a?.ok ? a.warnings.map((w) => this.withLabels(w.message)) : [];
  }

  /**
   * The core names inputs by their request names (`Field radiusDonor is required.`), which suit
   * the API and the command line; the dialog says the labels the user sees instead.
   */
  private withLabels(message: string): string {
    let out = message;
    for (const row of this.rows) {
      const name = row.spec.name;
      out = out
        .replace(new RegExp(`\\bField ${name}\\b`, 'g'), row.label)
        .replace(new RegExp(`\\b${name}\\b`, 'g'), row.label);
    }
    return out;
  }

  protected textOf(value: number | null): string {
    return editableText(value);
  }

  protected useValue(): void {
    const a = this.answer();
    const preview = this.preview();
    if (!a?.ok || !preview || !this.canUse()) return;
    const values: Array<{ kind: keyof typeof PARAMETER_KINDS; value: number }> = [
      { kind: this.data.derivation.target, value: preview.canonical },
    ];
    for (const extra of this.data.derivation.alsoFills ?? []) {
      const v = a.outputs[extra.output];
      if (typeof v === 'number') values.push({ kind: extra.kind, value: v });
    }
    this.ref.close({
      methodId: this.data.derivation.methodId,
      methodInputs: this.typedInputs(),
      values,
    });
  }
}
