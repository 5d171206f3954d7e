import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import { ReportsApi } from '../reports-api';

/**
 * `w/:wid/reports/new?pairId=…` (or `pairIds=a,b,…`): freezes the pair(s) into a draft report and
 * opens it. The pair page's "Create report" action links here.
 */
@Component({
  selector: 'gw-create-report',
  imports: [RouterLink],
  template: `
    <div class="gw-page reports">
      @if (error(); as e) {
        <p class="error" role="alert">Could not create the report: {{ e }}</p>
        <a [routerLink]="['/w', wid, 'pairs']">Back to the pairs</a>
      } @else {
        <p role="status">Freezing the pair into a report snapshot…</p>
      }
    </div>
  `,
  styleUrl: '../reports.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CreateReport {
  private readonly api = inject(ReportsApi);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);
  protected readonly wid = this.route.snapshot.paramMap.get('wid') ?? '';
  protected readonly error = signal<string | null>(null);

  constructor() {
    const q = this.route.snapshot.queryParamMap;
    const ids = (q.get('pairIds') ?? q.get('pairId') ?? '').split(',').filter(Boolean);
    if (ids.length === 0) {
      this.error.set('no pair given');
      return;
    }
    this.api.create(this.wid, ids).subscribe({
      next: (r) =>
        void this.router.navigate(['/w', this.wid, 'reports', r.reportId], { replaceUrl: true }),
      error: (e: { error?: { error?: { message?: string } } }) =>
        this.error.set(e.error?.error?.message ?? 'the server refused'),
    });
  }
}
