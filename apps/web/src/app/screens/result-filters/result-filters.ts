import { ChangeDetectionStrategy, Component, inject, input, output } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import {
  FormArray,
  FormControl,
  FormGroup,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  type AbstractControl,
  type ValidationErrors,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { ScreenNumericColumn } from '@gapwise/contracts';
import { debounceTime } from 'rxjs';
import { RichText } from '../../shared/rich-text/rich-text';
import { parseStrictNumber } from '../../units/number-format';
import { RESULT_COLUMNS, WARNING_LABELS, storedValue } from '../result-columns';
import type { FormFilter, RangeMap } from '../screen-results-store';

type RangeGroup = FormGroup<{
  column: FormControl<ScreenNumericColumn>;
  min: FormControl<string>;
  max: FormControl<string>;
}>;

const numberOrBlank = (c: AbstractControl<string>): ValidationErrors | null =>
  c.value.trim() === '' || parseStrictNumber(c.value) !== null ? null : { number: true };

/** Turns the form's value into a filter (blank bounds left out; |H_AB| typed in meV). */
export function filterOf(value: {
  ranges: Array<{ column: ScreenNumericColumn; min: string; max: string }>;
  regimeCs: string;
  regimeCr: string;
  warnings: string[];
  noWarnings: boolean;
  q: string;
}): FormFilter {
  const ranges: Record<string, { min?: number; max?: number }> = {};
  for (const r of value.ranges) {
    const min = r.min.trim() === '' ? null : parseStrictNumber(r.min);
    const max = r.max.trim() === '' ? null : parseStrictNumber(r.max);
    if (min === null && max === null) continue;
    ranges[r.column] = {
      ...(min !== null ? { min: storedValue(r.column, min) } : {}),
      ...(max !== null ? { max: storedValue(r.column, max) } : {}),
    };
  }
  return {
    ranges: ranges as RangeMap,
    regimeCs: value.regimeCs || undefined,
    regimeCr: value.regimeCr || undefined,
    warnings: value.warnings,
    noWarnings: value.noWarnings,
    q: value.q,
  };
}

/** Server-side filters of a screen's results: numeric ranges, regimes, warnings, text. */
@Component({
  selector: 'gw-result-filters',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    RichText,
  ],
  templateUrl: './result-filters.html',
  styleUrl: './result-filters.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ResultFilters {
  private readonly fb = inject(NonNullableFormBuilder);
  readonly warningCodes = input<readonly string[]>(Object.keys(WARNING_LABELS));
  readonly changed = output<FormFilter>();

  protected readonly columns = RESULT_COLUMNS.filter((c) => c.key !== 'rowNumber');
  protected readonly warningLabels = WARNING_LABELS;
  protected readonly form = this.fb.group({
    ranges: this.fb.array<RangeGroup>([this.range('deltaGCs'), this.range('deltaGCr')]),
    regimeCs: this.fb.control(''),
    regimeCr: this.fb.control(''),
    warnings: this.fb.control<string[]>([]),
    noWarnings: this.fb.control(false),
    q: this.fb.control(''),
  });

  constructor() {
    this.form.valueChanges.pipe(debounceTime(300), takeUntilDestroyed()).subscribe(() => {
      if (this.form.valid) this.changed.emit(filterOf(this.form.getRawValue()));
    });
  }

  protected get ranges(): FormArray<RangeGroup> {
    return this.form.controls.ranges;
  }

  /** Quantity with unit, with subscript markup (`|H_AB| / meV`). */
  protected labelOf(column: ScreenNumericColumn): string {
    return RESULT_COLUMNS.find((x) => x.key === column)?.label ?? column;
  }

  protected unitOf(column: ScreenNumericColumn): string {
    const c = RESULT_COLUMNS.find((x) => x.key === column);
    return c?.unit === 'log10 s-1' ? 'log₁₀ s⁻¹' : (c?.unit ?? '');
  }

  protected addRange(): void {
    const used = new Set(this.ranges.getRawValue().map((r) => r.column));
    const next = this.columns.find((c) => !used.has(c.key))?.key ?? 'score';
    this.ranges.push(this.range(next));
  }

  protected removeRange(i: number): void {
    this.ranges.removeAt(i);
  }

  protected clearAll(): void {
    this.ranges.clear();
    this.ranges.push(this.range('deltaGCs'));
    this.ranges.push(this.range('deltaGCr'));
    this.form.patchValue({ regimeCs: '', regimeCr: '', warnings: [], noWarnings: false, q: '' });
  }

  private range(column: ScreenNumericColumn): RangeGroup {
    return this.fb.group({
      column: this.fb.control(column),
      min: this.fb.control('', numberOrBlank),
      max: this.fb.control('', numberOrBlank),
    });
  }
}
