import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import {
  canEdit,
  canReview,
  formatEnergyEv,
  displayUnit,
  formatInputQuantity,
  formatMeasured,
  formatLog10,
  formatNumber,
  formatRate,
  formatRateWithLog,
  formatRegime,
  formatReportDate,
  formatReportStatus,
  formatUncertainty,
  intervalText,
  modelName,
  pairPlotInputs,
  pairRateRequest,
  reviewRounds,
  reviewStatusText,
  transitionText,
  plainText,
  snapshotRatesView,
  snapshotSource,
  totalLambdaEv,
  type ReportAction,
  type ReportCommentView,
  type ReportPairSnapshot,
  type ReportView as Report,
  type ReportInput,
} from '@gapwise/contracts';
import type { DrivingForceInputs } from '@gapwise/plots';
import { DrivingForcePlot } from '../../plots/driving-force-plot/driving-force-plot';
import { ParabolaPlot } from '../../plots/parabola-plot/parabola-plot';
import { TemperaturePlot } from '../../plots/temperature-plot/temperature-plot';
import { Session } from '../../session/session';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { ReportsApi } from '../reports-api';
import { ReportStatusChip } from '../report-status-chip';
import { RichText } from '../../shared/rich-text/rich-text';
import { ProvenanceSentence } from '../../shared/provenance-sentence/provenance-sentence';
import { ReportCascade } from './report-cascade';

interface Thread {
  readonly comment: ReportCommentView;
  readonly depth: number;
}

/** A report as the PDF shows it, with threaded comments and the review actions of my role. */
@Component({
  selector: 'gw-report-view',
  imports: [
    FormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    RouterLink,
    ReportStatusChip,
    ParabolaPlot,
    DrivingForcePlot,
    TemperaturePlot,
    RichText,
    ProvenanceSentence,
    ReportCascade,
  ],
  templateUrl: './report-view.html',
  styleUrl: '../reports.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReportViewPage {
  private readonly api = inject(ReportsApi);
  private readonly route = inject(ActivatedRoute);
  private readonly router = inject(Router);
  private readonly session = inject(Session);
  private readonly workspace = inject(WorkspaceContext);

  protected readonly report = signal<Report | null>(null);
  protected readonly busy = signal(false);
  /** The outcome of the last action: a confirmation, or the server's refusal. */
  protected readonly message = signal<{ text: string; error: boolean } | null>(null);
  protected note = '';
  protected commentBody = '';
  protected commentAnchor = '';
  protected replyTo = signal<ReportCommentView | null>(null);

  /** A label without its markup, for aria-labels (`|H_AB|` → `|HAB|`). */
  protected readonly plain = plainText;
  protected readonly f = {
    rate: formatRate,
    log: formatLog10,
    energy: formatEnergyEv,
    regime: formatRegime,
    date: formatReportDate,
    status: formatReportStatus,
    model: modelName,
    typed: formatInputQuantity,
    sigma: formatUncertainty,
    interval: intervalText,
    rateWithLog: formatRateWithLog,
    num: formatNumber,
  };

  /**
   * An input as the report reads it: a typed value as typed (up to 6 significant figures); a
   * derived one (a helper's, a trace's, a fit's) with the digits its σ supports — its stored
   * 12 digits are arithmetic, not knowledge (full precision stays in the snapshot and exports).
   */
  protected inputText(i: ReportInput, which: 'typed' | 'canonical'): string {
    const canonical = which === 'canonical';
    const value = canonical ? i.value : i.typedValue;
    const unit = canonical ? i.canonicalUnit : i.typedUnit;
    if (i.provenance.kind !== 'derived') {
      return formatInputQuantity(value, unit, canonical && i.typedUnit !== i.canonicalUnit ? 5 : 6);
    }
    // σ is stored in the canonical unit. A linear unit scales it with the value; a temperature
    // offset (°C) leaves it as it is; nm (reciprocal in energy) has no single factor, so a value
    // in nm gets 4 significant figures.
    const scale = canonical || i.kind === 'temperature' ? 1 : i.typedValue / i.value;
    const sigma =
      i.uncertainty === null || unit === 'nm' || !Number.isFinite(scale)
        ? null
        : i.uncertainty * Math.abs(scale);
    const text = formatMeasured(value, sigma).split(' ± ')[0]!;
    const u = displayUnit(unit);
    return u ? `${text} ${u}` : text;
  }

  /** ± 1σ in the canonical unit, 2 significant digits (the rule of `formatMeasured`). */
  protected sigmaText(i: ReportInput): string {
    if (i.uncertainty === null) return '—';
    const u = displayUnit(i.canonicalUnit);
    return `± ${formatNumber(i.uncertainty, 2, true)}${u ? ' ' + u : ''}`;
  }

  /** "Approved, revision 2": revisions count the submissions a reviewer saw. */
  protected readonly reviewStatus = computed(() => {
    const r = this.report();
    return r ? reviewStatusText(r.status, r.history) : '';
  });

  /** Decision column: submissions numbered, with whether the snapshot changed since the last. */
  protected readonly decisions = computed(() => {
    const history = this.report()?.history ?? [];
    const rounds = reviewRounds(history);
    return history.map((t, i) => transitionText(t, rounds[i]));
  });

  protected readonly wid = computed(
    () => this.report()?.workspaceId ?? this.route.snapshot.paramMap.get('wid') ?? '',
  );
  private readonly me = computed(() => this.session.user()?.id ?? null);
  protected readonly isAuthor = computed(() => this.report()?.author.id === this.me());
  protected readonly frozen = computed(() => this.report()?.status === 'approved');
  protected readonly mayEdit = computed(() => canEdit(this.workspace.role()));
  protected readonly mayReview = computed(() => canReview(this.workspace.role()));
  protected readonly mayComment = computed(
    () => !this.frozen() && (this.mayEdit() || this.mayReview()),
  );
  protected readonly canSubmit = computed(
    () => this.mayEdit() && ['draft', 'changes-requested'].includes(this.report()?.status ?? ''),
  );
  protected readonly canDecide = computed(
    () => this.mayReview() && this.report()?.status === 'submitted',
  );
  protected readonly canApprove = computed(() => this.canDecide() && !this.isAuthor());

  protected readonly anchors = computed(() => {
    const seen = new Map<string, string>();
    for (const p of this.report()?.snapshot.pairs ?? [])
      for (const i of p.inputs) seen.set(i.kind, i.label);
    return [...seen.entries()].map(([kind, label]) => ({ kind, label }));
  });

  protected readonly threads = computed<Thread[]>(() => {
    const comments = this.report()?.comments ?? [];
    const ids = new Set(comments.map((c) => c.id));
    const out: Thread[] = [];
    const walk = (parent: string | null, depth: number) => {
      for (const c of comments) {
        const p = c.parentId && ids.has(c.parentId) ? c.parentId : null;
        if (p === parent) {
          out.push({ comment: c, depth: Math.min(depth, 4) });
          walk(c.id, depth + 1);
        }
      }
    };
    walk(null, 0);
    return out;
  });

  constructor() {
    this.load();
  }

  private load(): void {
    const id = this.route.snapshot.paramMap.get('id') ?? '';
    this.api.get(id).subscribe((r) => this.report.set(r));
  }

  protected anchorLabel(kind: string | null): string {
    return this.anchors().find((a) => a.kind === kind)?.label ?? kind ?? '';
  }

  protected commentsOn(kind: string): number {
    return (this.report()?.comments ?? []).filter((c) => c.anchor === kind).length;
  }

  protected primary(pair: ReportPairSnapshot) {
    return pair.results.find((r) => r.primary) ?? null;
  }

  protected value(pair: ReportPairSnapshot, kind: string): number | null {
    return pair.inputs.find((i) => i.kind === kind)?.value ?? null;
  }

  protected lambda(pair: ReportPairSnapshot): number | null {
    return totalLambdaEv(pair.inputs);
  }

  protected hasSigma(pair: ReportPairSnapshot): boolean {
    return pair.inputs.some((i) => i.uncertainty !== null && i.uncertainty > 0);
  }

  protected drivingForce(pair: ReportPairSnapshot): DrivingForceInputs | null {
    return pairPlotInputs(snapshotSource(pair), this.primary(pair)?.log10k ?? null);
  }

  /** k_CS beside k_CR and their ratio, as the PDF prints them; null without recombination. */
  protected steps(pair: ReportPairSnapshot) {
    return snapshotRatesView(pair);
  }

  protected rateRequest(pair: ReportPairSnapshot) {
    const request = pairRateRequest(snapshotSource(pair));
    return 'missing' in request ? null : request;
  }

  protected commentOn(kind: string): void {
    this.commentAnchor = kind;
    this.replyTo.set(null);
    document.getElementById('comment-body')?.focus();
  }

  protected reply(c: ReportCommentView): void {
    this.replyTo.set(c);
    this.commentAnchor = c.anchor ?? '';
    document.getElementById('comment-body')?.focus();
  }

  protected decide(action: ReportAction): void {
    const r = this.report();
    if (!r) return;
    this.run(this.api.decide(r.reportId, action, this.note), () => (this.note = ''));
  }

  protected revise(): void {
    const r = this.report();
    if (r)
      this.run(this.api.revise(r.reportId), () =>
        this.message.set({
          text: 'New snapshot taken from the pair’s current version.',
          error: false,
        }),
      );
  }

  protected postComment(): void {
    const r = this.report();
    if (!r || !this.commentBody.trim()) return;
    const body = {
      body: this.commentBody,
      anchor: this.commentAnchor || null,
      parentId: this.replyTo()?.id ?? null,
    };
    this.run(this.api.comment(r.reportId, body), () => {
      this.commentBody = '';
      this.replyTo.set(null);
    });
  }

  protected deleteReport(): void {
    const r = this.report();
    if (!r || !confirm(`Delete the report “${r.title}”?`)) return;
    this.busy.set(true);
    this.api.remove(r.reportId).subscribe({
      next: () => void this.router.navigate(['/w', r.workspaceId, 'reports']),
      error: () => this.busy.set(false),
    });
  }

  protected pdfUrl(r: Report): string {
    return this.api.pdfUrl(r.reportId);
  }

  protected exportUrl(r: Report, format: 'csv' | 'json'): string {
    return this.api.exportUrl(r.reportId, format);
  }

  private run(call: ReturnType<ReportsApi['get']>, after: () => void): void {
    this.busy.set(true);
    this.message.set(null);
    call.subscribe({
      next: (r) => {
        this.report.set(r);
        this.busy.set(false);
        after();
      },
      error: (e: { error?: { error?: { message?: string } } }) => {
        this.busy.set(false);
        this.message.set({
          text: e.error?.error?.message ?? 'The server refused this action.',
          error: true,
        });
      },
    });
  }
}
