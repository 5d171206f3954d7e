import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { Screen, ScreenStatus } from '@gapwise/contracts';
import type { AppIconName } from '../../icons/app-icons';

const count = new Intl.NumberFormat('en-GB');

/** `75` → `1 min 15 s`; `3725` → `1 h 2 min`; under a second → `under 1 s`. */
export function formatEta(seconds: number | null): string {
  if (seconds === null || !Number.isFinite(seconds) || seconds < 0) return '—';
  if (seconds < 1) return 'under 1 s';
  const s = Math.round(seconds);
  if (s < 60) return `${s} s`;
  if (s < 3600) return `${Math.floor(s / 60)} min ${s % 60} s`;
  return `${Math.floor(s / 3600)} h ${Math.floor((s % 3600) / 60)} min`;
}

export function formatRowsPerSecond(rate: number | null): string {
  if (rate === null || !Number.isFinite(rate)) return '—';
  return `${count.format(Math.round(rate))} rows/s`;
}

export const STATUS_LABELS: Record<ScreenStatus, string> = {
  uploaded: 'Queued',
  running: 'Running',
  cancelled: 'Cancelled',
  done: 'Finished',
  failed: 'Failed',
};

export const STATUS_ICONS: Record<ScreenStatus, AppIconName> = {
  uploaded: 'schedule',
  running: 'autorenew',
  cancelled: 'block',
  done: 'check_circle',
  failed: 'error',
};

/** Rows done of all rows, rows per second and time left, as a bar and in words. */
@Component({
  selector: 'gw-screen-progress',
  imports: [MatProgressBarModule],
  template: `
    @let s = screen();
    <div class="progress" [attr.data-status]="s.status">
      <mat-progress-bar
        mode="determinate"
        [value]="percent()"
        [attr.aria-label]="'Rows computed: ' + percent().toFixed(0) + ' %'"
      />
      <p class="figures" aria-live="polite">
        <span class="rows"
          ><strong>{{ rowsDone() }}</strong> of {{ rowCount() }} rows computed ({{
            percent().toFixed(0)
          }}
          %)</span
        >
        @if (s.status === 'running' || s.status === 'uploaded') {
          <span class="rate">{{ rate() }}</span>
          <span class="eta">about {{ eta() }} left</span>
        } @else if (s.progress.rowsPerSecond !== null) {
          <span class="rate">averaged {{ rate() }}</span>
        }
        <span class="chunks"
          >{{ s.progress.chunksDone }} of {{ s.progress.chunkCount }} chunks</span
        >
      </p>
    </div>
  `,
  styles: `
    .figures {
      display: flex;
      flex-wrap: wrap;
      gap: 4px 20px;
      margin: 6px 0 0;
      font: var(--mat-sys-body-medium);
      font-variant-numeric: tabular-nums;
    }
    .rate,
    .eta,
    .chunks {
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ScreenProgress {
  readonly screen = input.required<Screen>();

  protected readonly percent = computed(() => {
    const p = this.screen().progress;
    return p.rowCount > 0 ? (100 * p.rowsDone) / p.rowCount : 0;
  });
  protected readonly rowsDone = computed(() => count.format(this.screen().progress.rowsDone));
  protected readonly rowCount = computed(() => count.format(this.screen().progress.rowCount));
  protected readonly rate = computed(() =>
    formatRowsPerSecond(this.screen().progress.rowsPerSecond),
  );
  protected readonly eta = computed(() => formatEta(this.screen().progress.etaSeconds));
}
