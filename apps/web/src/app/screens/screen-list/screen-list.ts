import { formatReportDate } from '@gapwise/contracts';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { ActivatedRoute, RouterLink } from '@angular/router';
import type { Screen } from '@gapwise/contracts';
import { map, switchMap } from 'rxjs';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { STATUS_ICONS, STATUS_LABELS } from '../screen-progress/screen-progress';
import { ScreensApi } from '../screens-api';

const count = new Intl.NumberFormat('en-GB');

/** Screens of the workspace with their status and progress. */
@Component({
  selector: 'gw-screen-list',
  imports: [RouterLink, MatButtonModule, MatIconModule],
  template: `
    <div class="gw-page">
      <header class="head">
        <h1 class="gw-title">Screens</h1>
        <span class="spacer"></span>
        <a mat-button [href]="api.templateUrl" download>
          <mat-icon aria-hidden="true" svgIcon="description"></mat-icon> Template (CSV)
        </a>
        @if (workspace.canEdit()) {
          <a mat-flat-button [routerLink]="['/w', wid(), 'screens', 'new']">
            <mat-icon aria-hidden="true" svgIcon="upload_file"></mat-icon> New screen
          </a>
        }
      </header>
      <p class="intro">
        A screen computes many donor–acceptor pairs from one CSV file on background workers and
        ranks them.
      </p>
      @if (screens(); as list) {
        @if (list.length) {
          <div class="gw-table-scroll">
            <table class="gw-table screens">
              <thead>
                <tr>
                  <th scope="col">Name</th>
                  <th scope="col">Status</th>
                  <th scope="col" class="num">Rows</th>
                  <th scope="col" class="num">Computed</th>
                  <th scope="col" class="num">Bad rows</th>
                  <th scope="col">Uploaded</th>
                </tr>
              </thead>
              <tbody>
                @for (s of list; track s.id) {
                  <tr>
                    <th scope="row">
                      <a [routerLink]="['/w', wid(), 'screens', s.id]">{{ s.name }}</a>
                    </th>
                    <td>
                      <span class="status"
                        ><mat-icon aria-hidden="true" [svgIcon]="icons[s.status]"></mat-icon>
                        {{ labels[s.status] }}</span
                      >
                    </td>
                    <td class="num">{{ n(s.rowCount) }}</td>
                    <td class="num">{{ percent(s) }}</td>
                    <td class="num">{{ s.badRowCount ? n(s.badRowCount) : '—' }}</td>
                    <td>{{ date(s.createdAt) }}</td>
                  </tr>
                }
              </tbody>
            </table>
          </div>
        } @else {
          <p class="muted">
            No screens yet. Download the template, fill one row per pair, and upload it as a new
            screen.
          </p>
        }
      } @else {
        <p class="muted">Loading…</p>
      }
    </div>
  `,
  styleUrl: '../screens.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ScreenList {
  protected readonly api = inject(ScreensApi);
  private readonly route = inject(ActivatedRoute);
  protected readonly workspace = inject(WorkspaceContext);
  protected readonly labels = STATUS_LABELS;
  protected readonly icons = STATUS_ICONS;
  protected readonly wid = toSignal(this.route.paramMap.pipe(map((p) => p.get('wid') ?? '')), {
    initialValue: '',
  });
  protected readonly screens = toSignal(
    this.route.paramMap.pipe(switchMap((p) => this.api.list(p.get('wid') ?? ''))),
  );

  protected n(value: number): string {
    return count.format(value);
  }

  protected percent(s: Screen): string {
    const p = s.progress;
    return p.rowCount ? `${Math.floor((100 * p.rowsDone) / p.rowCount)} %` : '—';
  }

  protected date(iso: string): string {
    return formatReportDate(iso);
  }
}
