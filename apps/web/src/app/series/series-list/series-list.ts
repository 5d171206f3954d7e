import { formatReportDate } from '@gapwise/contracts';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { ActivatedRoute, RouterLink } from '@angular/router';
import { map, switchMap } from 'rxjs';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { SeriesApi } from '../series-api';

/** Driving-force series of the workspace. */
@Component({
  selector: 'gw-series-list',
  imports: [RouterLink, MatButtonModule, MatIconModule],
  template: `
    <div class="gw-page">
      <header class="head">
        <h1 class="gw-title">Series fits</h1>
        <span class="spacer"></span>
        @if (workspace.canEdit()) {
          <a mat-flat-button [routerLink]="['/w', wid(), 'series', 'new']">
            <mat-icon aria-hidden="true" svgIcon="add"></mat-icon> New series
          </a>
        }
      </header>
      <p class="muted">
        Measured rate constants of a family of related pairs against driving force; fit λ and
        |H<sub>AB</sub>| and write them back to the pairs.
      </p>
      @if (series(); as list) {
        @if (list.length) {
          <table class="gw-table series-table">
            <thead>
              <tr>
                <th scope="col">Name</th>
                <th scope="col" class="num">Points</th>
                <th scope="col" class="num">T / K</th>
                <th scope="col">Fitted</th>
                <th scope="col">Last change</th>
              </tr>
            </thead>
            <tbody>
              @for (s of list; track s.id) {
                <tr>
                  <th scope="row">
                    <a [routerLink]="['/w', wid(), 'series', s.id]">{{ s.name }}</a>
                  </th>
                  <td class="num">{{ s.pointCount }}</td>
                  <td class="num">{{ s.temperature.toFixed(2) }}</td>
                  <td>{{ s.fitted ? 'yes' : 'not yet' }}</td>
                  <td>{{ date(s.updatedAt) }}</td>
                </tr>
              }
            </tbody>
          </table>
        } @else {
          <p class="muted">No series yet.</p>
        }
      } @else {
        <p class="muted">Loading…</p>
      }
    </div>
  `,
  styleUrl: '../series.scss',
  styles: '.series-table { width: 100%; } .series-table a { color: var(--mat-sys-primary); }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SeriesList {
  private readonly api = inject(SeriesApi);
  private readonly route = inject(ActivatedRoute);
  protected readonly workspace = inject(WorkspaceContext);
  protected readonly wid = toSignal(this.route.paramMap.pipe(map((p) => p.get('wid') ?? '')), {
    initialValue: '',
  });
  protected readonly series = toSignal(
    this.route.paramMap.pipe(switchMap((p) => this.api.list(p.get('wid') ?? ''))),
  );

  protected date(iso: string): string {
    return formatReportDate(iso);
  }
}
