import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import type { AttachableTraceParameter, Pair, PairListItem } from '@gapwise/contracts';
import { PairsApi } from '../../pairs/pairs-api';
import { apiErrorOf } from '../../session/api-errors';
import { RichText } from '../../shared/rich-text/rich-text';
import { formatSignificant } from '../../units/number-format';
import { TracesApi } from '../traces-api';

export interface AttachDialogData {
  readonly workspaceId: string;
  readonly analysisId: string;
  /** eV */
  readonly lambda: number;
  readonly deltaG0: number;
  readonly temperatureK: number;
}

/**
 * "Use as λ (and ΔG°) of pair …": writes the analysis' values on a pair as derived parameters
 * (a new version of the pair, whose provenance names the analysis and both traces).
 */
@Component({
  selector: 'gw-attach-dialog',
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatSelectModule,
    RichText,
  ],
  template: `
    <h2 mat-dialog-title>Use on a pair</h2>
    <form [formGroup]="form" (ngSubmit)="save()">
      <mat-dialog-content>
        <p>
          λ = {{ fmt(data.lambda, 4) }} eV and ΔG° = {{ fmt(data.deltaG0, 4) }} eV from energy-gap
          samples at {{ data.temperatureK }} K. They are saved as <em>derived</em> values whose
          source is this analysis and its two trace files.
        </p>
        @if (pairs(); as list) {
          <mat-form-field class="wide">
            <mat-label>Pair</mat-label>
            <mat-select formControlName="pairId" class="pair-select">
              @for (p of list; track p.id) {
                <mat-option [value]="p.id"
                  >{{ p.name }} — {{ p.donor }} / {{ p.acceptor }} (v{{ p.version }})</mat-option
                >
              }
            </mat-select>
          </mat-form-field>
        } @else {
          <p class="hint">Loading the pairs of this workspace…</p>
        }
        <div class="choices">
          <mat-checkbox formControlName="lambda" class="lambda-box">λ, as</mat-checkbox>
          <mat-form-field class="kind">
            <mat-label>which λ</mat-label>
            <mat-select formControlName="lambdaKind">
              <mat-option value="lambdaOuter">outer λₒ (solvent)</mat-option>
              <mat-option value="lambdaInner">inner λᵢ</mat-option>
            </mat-select>
          </mat-form-field>
          <mat-checkbox formControlName="deltaG0" class="dg-box">ΔG°</mat-checkbox>
        </div>
        <p class="hint">
          The pair's total λ is λᵢ + λₒ; sampled λ usually holds both, so check the other one on the
          pair.
        </p>
        @if (error(); as message) {
          <p class="error" role="alert"><gw-rich-text [text]="message" /></p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button
          mat-flat-button
          type="submit"
          class="save-attach"
          [disabled]="form.invalid || busy() || (!form.value.lambda && !form.value.deltaG0)"
        >
          Save on the pair
        </button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .wide {
      width: 100%;
    }
    .choices {
      display: flex;
      align-items: center;
      gap: 12px;
      flex-wrap: wrap;
    }
    .hint {
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-small);
    }
    .error {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AttachDialog {
  protected readonly data = inject<AttachDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<AttachDialog, Pair>>(MatDialogRef);
  private readonly traces = inject(TracesApi);
  private readonly pairsApi = inject(PairsApi);

  protected readonly pairs = signal<PairListItem[] | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly busy = signal(false);
  protected readonly fmt = formatSignificant;

  protected readonly form = new FormGroup({
    pairId: new FormControl('', { nonNullable: true, validators: Validators.required }),
    lambda: new FormControl(true, { nonNullable: true }),
    lambdaKind: new FormControl<'lambdaOuter' | 'lambdaInner'>('lambdaOuter', {
      nonNullable: true,
    }),
    deltaG0: new FormControl(false, { nonNullable: true }),
  });

  constructor() {
    this.pairsApi.list(this.data.workspaceId, { offset: 0, limit: 500, sort: 'name' }).subscribe({
      next: (page) => this.pairs.set(page.items),
      error: (err: unknown) => this.error.set(apiErrorOf(err).message),
    });
  }

  protected save(): void {
    const v = this.form.getRawValue();
    const parameters: AttachableTraceParameter[] = [];
    if (v.lambda) parameters.push('lambda');
    if (v.deltaG0) parameters.push('deltaG0');
    if (!v.pairId || parameters.length === 0) return;
    this.busy.set(true);
    this.error.set(null);
    this.traces
      .attach(this.data.analysisId, { pairId: v.pairId, parameters, lambdaKind: v.lambdaKind })
      .subscribe({
        next: (pair) => this.ref.close(pair),
        error: (err: unknown) => {
          this.busy.set(false);
          this.error.set(apiErrorOf(err).message);
        },
      });
  }
}
