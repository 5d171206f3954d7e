import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatRadioModule } from '@angular/material/radio';
import type { Pair, SeriesModel } from '@gapwise/contracts';
import { PairsApi } from '../../pairs/pairs-api';
import { apiErrorOf } from '../../session/api-errors';
import { formatFixed, formatSignificant } from '../../units/number-format';
import { SeriesApi } from '../series-api';
import { MODEL_NAMES } from '../series-plot/series-plot';

export interface ApplyDialogData {
  readonly seriesId: string;
  readonly workspaceId: string;
  readonly models: ReadonlyArray<{ model: SeriesModel; lambda: number; coupling: number }>;
  readonly preferred: SeriesModel;
  /** Pairs linked from the series' points (checked at first). */
  readonly linkedPairIds: readonly string[];
}

/** Choose pairs and a model; the fitted λ and |H_AB| are written as derived parameters. */
@Component({
  selector: 'gw-apply-dialog',
  imports: [FormsModule, MatButtonModule, MatCheckboxModule, MatDialogModule, MatRadioModule],
  template: `
    <h2 mat-dialog-title>Apply the fit to pairs</h2>
    <mat-dialog-content>
      <p>
        Each chosen pair gets the fitted λ and |H<sub>AB</sub>| as <em>derived</em> parameters whose
        provenance names this series (a new version of the pair).
      </p>
      <mat-radio-group [(ngModel)]="model" aria-label="Model" class="models">
        @for (m of data.models; track m.model) {
          <mat-radio-button [value]="m.model">
            {{ names[m.model] }}: λ<sub>{{ m.model === 'mlj' ? 's' : '' }}</sub> =
            {{ fx(m.lambda, 3) }} eV, |H<sub>AB</sub>| = {{ sig(m.coupling * 1000) }} meV
          </mat-radio-button>
        }
      </mat-radio-group>
      <h3>Pairs</h3>
      @if (pairs(); as list) {
        @if (list.length) {
          <div class="pairs">
            @for (p of list; track p.id) {
              <mat-checkbox [checked]="chosen().has(p.id)" (change)="toggle(p.id)">
                {{ p.name }} <span class="muted">({{ p.donor }} → {{ p.acceptor }})</span>
              </mat-checkbox>
            }
          </div>
        } @else {
          <p class="muted">This workspace has no pairs yet.</p>
        }
      } @else {
        <p class="muted">Loading pairs…</p>
      }
      @if (error(); as e) {
        <p class="error" role="alert">{{ e }}</p>
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>Cancel</button>
      <button
        mat-flat-button
        type="button"
        class="apply"
        [disabled]="chosen().size === 0 || busy()"
        (click)="apply()"
      >
        Apply to {{ chosen().size }} pair(s)
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    .models,
    .pairs {
      display: flex;
      flex-direction: column;
      gap: 2px;
    }
    .muted {
      color: var(--mat-sys-on-surface-variant);
    }
    .error {
      color: var(--mat-sys-error);
    }
    h3 {
      font: var(--mat-sys-title-small);
      margin: 16px 0 4px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ApplyDialog {
  protected readonly data = inject<ApplyDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<ApplyDialog, Pair[]>>(MatDialogRef);
  private readonly seriesApi = inject(SeriesApi);
  private readonly pairsApi = inject(PairsApi);

  protected readonly names = MODEL_NAMES;
  protected readonly fx = formatFixed;
  protected readonly sig = (v: number) => formatSignificant(v, 3);
  protected model: SeriesModel = this.data.preferred;
  protected readonly pairs = signal<Array<{
    id: string;
    name: string;
    donor: string;
    acceptor: string;
  }> | null>(null);
  protected readonly chosen = signal(new Set<string>(this.data.linkedPairIds));
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);

  constructor() {
    this.pairsApi
      .list(this.data.workspaceId, { offset: 0, limit: 500, sort: 'name' })
      .subscribe((page) => this.pairs.set(page.items));
  }

  protected toggle(id: string): void {
    const next = new Set(this.chosen());
    if (next.has(id)) next.delete(id);
    else next.add(id);
    this.chosen.set(next);
  }

  protected apply(): void {
    this.busy.set(true);
    this.error.set(null);
    this.seriesApi.apply(this.data.seriesId, [...this.chosen()], this.model).subscribe({
      next: (r) => this.ref.close(r.pairs),
      error: (err: unknown) => {
        this.busy.set(false);
        this.error.set(apiErrorOf(err).message);
      },
    });
  }
}
