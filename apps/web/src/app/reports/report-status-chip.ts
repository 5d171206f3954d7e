import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { formatReportStatus, type ReportStatus } from '@gapwise/contracts';

/** The review status as a coloured label (draft grey, submitted amber, changes red, approved teal). */
@Component({
  selector: 'gw-report-status',
  template: `<span class="chip" [class]="'chip ' + status()">{{ label() }}</span>`,
  styles: `
    .chip {
      display: inline-block;
      padding: 2px 10px;
      border-radius: 12px;
      font-size: 12px;
      font-weight: 600;
      letter-spacing: 0.02em;
      color: #fff;
      background: #57606a;
      white-space: nowrap;
    }
    .submitted {
      background: #b26a00;
    }
    .changes-requested {
      background: #b3261e;
    }
    .approved {
      background: #00695c;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReportStatusChip {
  readonly status = input.required<ReportStatus>();
  protected readonly label = computed(() => formatReportStatus(this.status()));
}
