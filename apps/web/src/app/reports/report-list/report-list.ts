import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  signal,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import {
  REPORT_STATUSES,
  formatReportDate,
  formatReportStatus,
  type ReportListItem,
  type ReportStatus,
} from '@gapwise/contracts';
import { map } from 'rxjs';
import { PairsApi } from '../../pairs/pairs-api';
import { ReportsApi } from '../reports-api';
import { ReportStatusChip } from '../report-status-chip';

/** Reports of the workspace, filtered by status, author and pair (filters live in the URL). */
@Component({
  selector: 'gw-report-list',
  imports: [FormsModule, MatFormFieldModule, MatSelectModule, RouterLink, ReportStatusChip],
  templateUrl: './report-list.html',
  styleUrl: '../reports.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReportList {
  private readonly api = inject(ReportsApi);
  private readonly pairsApi = inject(PairsApi);
  private readonly route = inject(ActivatedRoute);
  private readonly router = inject(Router);

  protected readonly statuses = REPORT_STATUSES;
  protected readonly statusLabel = formatReportStatus;
  protected readonly date = formatReportDate;
  protected readonly wid = toSignal(this.route.paramMap.pipe(map((p) => p.get('wid') ?? '')), {
    initialValue: '',
  });
  private readonly query = toSignal(this.route.queryParamMap, { requireSync: true });
  protected readonly status = computed(
    () => (this.query().get('status') ?? '') as ReportStatus | '',
  );
  protected readonly author = computed(() => this.query().get('author') ?? '');
  protected readonly pairId = computed(() => this.query().get('pairId') ?? '');

  protected readonly reports = signal<ReportListItem[] | null>(null);
  protected readonly authors = signal<Array<{ id: string; displayName: string }>>([]);
  protected readonly pairs = signal<Array<{ id: string; name: string }>>([]);

  constructor() {
    effect(() => {
      const wid = this.wid();
      if (!wid) return;
      const filter = { status: this.status(), author: this.author(), pairId: this.pairId() };
      this.reports.set(null);
      this.api.list(wid, filter).subscribe((rows) => this.reports.set(rows));
    });
    effect(() => {
      const wid = this.wid();
      if (!wid) return;
      this.api.list(wid, {}).subscribe((rows) => {
        const seen = new Map(rows.map((r) => [r.author.id, r.author]));
        this.authors.set(
          [...seen.values()].sort((a, b) => a.displayName.localeCompare(b.displayName)),
        );
      });
      this.pairsApi.list(wid, { offset: 0, limit: 500, sort: 'name' }).subscribe((page) => {
        this.pairs.set(page.items.map((p) => ({ id: p.id, name: p.name })));
      });
    });
  }

  protected pairNames(item: ReportListItem): string {
    const names = new Map(this.pairs().map((p) => [p.id, p.name]));
    return item.pairIds.map((id) => names.get(id) ?? 'pair').join(', ');
  }

  protected applyFilter(key: 'status' | 'author' | 'pairId', value: string): void {
    void this.router.navigate([], {
      relativeTo: this.route,
      queryParams: { [key]: value || null },
      queryParamsHandling: 'merge',
    });
  }
}
