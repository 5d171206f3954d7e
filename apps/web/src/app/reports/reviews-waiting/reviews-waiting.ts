import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { RouterLink } from '@angular/router';
import { formatReportDate, type ReportListItem } from '@gapwise/contracts';
import { ReportsApi } from '../reports-api';

/** Submitted reports in workspaces where I review, written by someone else. */
@Component({
  selector: 'gw-reviews-waiting',
  imports: [RouterLink],
  template: `
    <div class="gw-page reports">
      <header class="head"><h1 class="gw-title">Reviews waiting for me</h1></header>
      @if (rows(); as list) {
        @if (list.length === 0) {
          <p class="empty">Nothing is waiting for your review.</p>
        } @else {
          <table class="gw-table" aria-label="Reports waiting for review">
            <thead>
              <tr>
                <th scope="col">Report</th>
                <th scope="col">Workspace</th>
                <th scope="col">Author</th>
                <th scope="col">Last change</th>
              </tr>
            </thead>
            <tbody>
              @for (r of list; track r.id) {
                <tr>
                  <td>
                    <a [routerLink]="['/w', r.workspaceId, 'reports', r.id]">{{ r.title }}</a>
                  </td>
                  <td>{{ r.workspaceName }}</td>
                  <td>{{ r.author.displayName }}</td>
                  <td>{{ date(r.updatedAt) }}</td>
                </tr>
              }
            </tbody>
          </table>
        }
      } @else {
        <p class="empty" role="status">Loading…</p>
      }
    </div>
  `,
  styleUrl: '../reports.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReviewsWaiting {
  private readonly api = inject(ReportsApi);
  protected readonly rows = signal<ReportListItem[] | null>(null);
  protected readonly date = formatReportDate;

  constructor() {
    this.api.waiting().subscribe((rows) => this.rows.set(rows));
  }
}
