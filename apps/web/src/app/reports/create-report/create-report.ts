import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import type { PairListItem, ReportView } from '@gapwise/contracts';
import type { Observable } from 'rxjs';
import { CascadesApi, type CascadeListItem } from '../../cascades/cascades-api';
import { PairsApi } from '../../pairs/pairs-api';
import { ReportsApi } from '../reports-api';

/**
 * `w/:wid/reports/new?pairId=…` (or `pairIds=a,b,…`): freezes the pair(s) into a draft report and
 * opens it; the pair page's "Create report" action links here. Without pairs (or with
 * `?cascadeId=…`, as the cascade page links) the user picks the subject — a cascade or a pair —
 * and creates the report.
 */
@Component({
  selector: 'gw-create-report',
  imports: [FormsModule, MatButtonModule, MatFormFieldModule, MatSelectModule, RouterLink],
  template: `
    <div class="gw-page reports create-report">
      <a class="back" [routerLink]="['/w', wid, 'reports']">← Reports</a>
      <h1 class="gw-title">New report</h1>
      @if (error(); as e) {
        <p class="error" role="alert">Could not create the report: {{ e }}</p>
      }
      @if (immediate) {
        @if (!error()) {
          <p role="status">Freezing the pair into a report snapshot…</p>
        }
      } @else {
        <form class="subject" (ngSubmit)="create()" aria-label="Report subject">
          <p class="muted">
            A report freezes the subject’s current version: its inputs, results, warnings and
            sources. A cascade report adds the yields, lifetimes and energy landscape.
          </p>
          <mat-form-field subscriptSizing="dynamic">
            <mat-label>Report on</mat-label>
            <mat-select name="subject" [(ngModel)]="subject" required>
              <mat-optgroup label="Cascades">
                @for (c of cascades(); track c.id) {
                  <mat-option [value]="'cascade:' + c.id"
                    >{{ c.name }} (v{{ c.version }})</mat-option
                  >
                } @empty {
                  <mat-option disabled>No cascades in this workspace</mat-option>
                }
              </mat-optgroup>
              <mat-optgroup label="Pairs">
                @for (p of pairs(); track p.id) {
                  <mat-option [value]="'pair:' + p.id">{{ p.name }}</mat-option>
                } @empty {
                  <mat-option disabled>No pairs in this workspace</mat-option>
                }
              </mat-optgroup>
            </mat-select>
          </mat-form-field>
          <button mat-flat-button type="submit" [disabled]="busy() || !subject">
            Create report
          </button>
          @if (busy()) {
            <p role="status">Freezing the subject into a report snapshot…</p>
          }
        </form>
      }
    </div>
  `,
  styleUrl: '../reports.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CreateReport {
  private readonly api = inject(ReportsApi);
  private readonly pairsApi = inject(PairsApi);
  private readonly cascadesApi = inject(CascadesApi);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);
  protected readonly wid = this.route.snapshot.paramMap.get('wid') ?? '';
  protected readonly error = signal<string | null>(null);
  protected readonly busy = signal(false);
  protected readonly pairs = signal<PairListItem[]>([]);
  protected readonly cascades = signal<CascadeListItem[]>([]);
  /** `cascade:<id>` or `pair:<id>`. */
  protected subject = '';
  /** Pairs given in the address: the report is created at once. */
  protected readonly immediate: boolean;

  constructor() {
    const q = this.route.snapshot.queryParamMap;
    const ids = (q.get('pairIds') ?? q.get('pairId') ?? '').split(',').filter(Boolean);
    this.immediate = ids.length > 0;
    if (this.immediate) {
      this.send(this.api.create(this.wid, ids));
      return;
    }
    const cascadeId = q.get('cascadeId');
    if (cascadeId) this.subject = `cascade:${cascadeId}`;
    this.cascadesApi.list(this.wid).subscribe((list) => this.cascades.set(list));
    this.pairsApi
      .list(this.wid, { offset: 0, limit: 500, sort: 'name' })
      .subscribe((page) => this.pairs.set(page.items));
  }

  protected create(): void {
    const [kind, id] = this.subject.split(':');
    if (!id) return;
    this.send(
      kind === 'cascade'
        ? this.api.createForCascade(this.wid, id)
        : this.api.create(this.wid, [id]),
    );
  }

  private send(call: Observable<ReportView>): void {
    this.busy.set(true);
    this.error.set(null);
    call.subscribe({
      next: (r) =>
        void this.router.navigate(['/w', this.wid, 'reports', r.reportId], { replaceUrl: true }),
      error: (e: { error?: { error?: { message?: string } } }) => {
        this.busy.set(false);
        this.error.set(e.error?.error?.message ?? 'the server refused');
      },
    });
  }
}
