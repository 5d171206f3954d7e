import { GwDatePipe } from '../../shared/date/gw-date';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import {
  canReadAudit,
  type AuditEvent,
  type Member,
  type Page,
  type PairListItem,
} from '@gapwise/contracts';
import { catchError, combineLatest, map, of, switchMap } from 'rxjs';
import { PairsApi } from '../../pairs/pairs-api';
import { apiErrorOf } from '../../session/api-errors';
import { MembersApi } from '../members/members-api';
import { WorkspaceContext } from '../workspace-context';
import { AuditApi, type AuditFilters } from './audit-api';
import { actionWords } from './audit-words';

/** Rows per page of the trail. */
export const AUDIT_PAGE_SIZE = 50;

type Loaded = { ok: true; page: Page<AuditEvent> } | { ok: false; message: string };

/**
 * The workspace's audit trail for its owners and reviewers: who did what and when, filtered by
 * person, pair and days (UTC), paged, and exported as CSV with the same filters.
 */
@Component({
  selector: 'gw-audit-trail',
  imports: [
    GwDatePipe,
    FormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
  ],
  templateUrl: './audit-trail.html',
  styleUrl: './audit-trail.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AuditTrail {
  private readonly api = inject(AuditApi);
  private readonly membersApi = inject(MembersApi);
  private readonly pairsApi = inject(PairsApi);
  protected readonly workspace = inject(WorkspaceContext);

  readonly wid = input.required<string>();

  protected readonly canRead = computed(() => canReadAudit(this.workspace.role()));
  protected readonly actorId = signal('');
  protected readonly pairId = signal('');
  protected readonly from = signal('');
  protected readonly to = signal('');
  protected readonly offset = signal(0);
  protected readonly pageSize = AUDIT_PAGE_SIZE;
  protected readonly actionWords = actionWords;

  protected readonly filters = computed<AuditFilters>(() => ({
    actorId: this.actorId() || undefined,
    pairId: this.pairId() || undefined,
    from: this.from() || undefined,
    to: this.to() || undefined,
  }));
  /** A day typed in another form than the page's one (YYYY-MM-DD), said and not sent. */
  protected readonly dayError = signal<string | null>(null);

  /**
   * A day filter as typed. The page writes every date as YYYY-MM-DD (UTC), so the day fields
   * take the same form rather than the browser's locale date picker (which showed mm/dd/yyyy).
   */
  protected setDay(which: 'from' | 'to', text: string): void {
    const value = (text ?? '').trim();
    const label = which === 'from' ? 'From (first day)' : 'To (last day)';
    const day = new Date(`${value}T00:00:00Z`);
    const valid =
      value === '' ||
      (/^\d{4}-\d{2}-\d{2}$/.test(value) &&
        !Number.isNaN(day.getTime()) &&
        day.toISOString().slice(0, 10) === value);
    if (!valid) {
      this.dayError.set(`${label} must be a day written as YYYY-MM-DD, e.g. 2026-12-05.`);
      return;
    }
    this.dayError.set(null);
    this.setFilter(which, value);
  }

  /** A range that ends before it starts is said, not sent. */
  protected readonly rangeError = computed(() =>
    this.from() && this.to() && this.from() > this.to()
      ? 'To (last day) must not be before From (first day).'
      : null,
  );

  protected readonly members = toSignal(
    toObservable(this.wid).pipe(
      switchMap((wid) => this.membersApi.members(wid).pipe(catchError(() => of<Member[]>([])))),
    ),
    { initialValue: [] as Member[] },
  );
  protected readonly pairs = toSignal(
    toObservable(this.wid).pipe(
      switchMap((wid) =>
        this.pairsApi.list(wid, { offset: 0, limit: 200, sort: 'name' }).pipe(
          map((p) => p.items),
          catchError(() => of<PairListItem[]>([])),
        ),
      ),
    ),
    { initialValue: [] as PairListItem[] },
  );

  private readonly loaded = toSignal(
    combineLatest([
      toObservable(this.wid),
      toObservable(this.filters),
      toObservable(this.offset),
      toObservable(this.rangeError),
    ]).pipe(
      switchMap(([wid, filters, offset, rangeError]) =>
        rangeError
          ? of<Loaded | null>(null)
          : this.api.page(wid, filters, offset, AUDIT_PAGE_SIZE).pipe(
              map((page): Loaded => ({ ok: true, page })),
              catchError((err: unknown) =>
                of<Loaded>({ ok: false, message: apiErrorOf(err).message }),
              ),
            ),
      ),
    ),
  );
  protected readonly page = computed(() => {
    const l = this.loaded();
    return l?.ok ? l.page : null;
  });
  protected readonly loadError = computed(() => {
    const l = this.loaded();
    return l && !l.ok ? l.message : null;
  });
  protected readonly exportUrl = computed(() => this.api.exportUrl(this.wid(), this.filters()));
  protected readonly pairNames = computed(
    () => new Map(this.pairs().map((p) => [p.id, p.name] as const)),
  );

  protected setFilter(which: 'actorId' | 'pairId' | 'from' | 'to', value: string): void {
    this[which].set(value ?? '');
    this.offset.set(0);
  }

  protected clearFilters(): void {
    this.dayError.set(null);
    for (const s of [this.actorId, this.pairId, this.from, this.to]) s.set('');
    this.offset.set(0);
  }

  protected readonly hasFilters = computed(
    () => !!(this.actorId() || this.pairId() || this.from() || this.to()),
  );

  protected older(): void {
    this.offset.update((o) => o + AUDIT_PAGE_SIZE);
  }

  protected newer(): void {
    this.offset.update((o) => Math.max(0, o - AUDIT_PAGE_SIZE));
  }
}
