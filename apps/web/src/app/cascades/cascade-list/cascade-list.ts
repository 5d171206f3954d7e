import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { ActivatedRoute, RouterLink } from '@angular/router';
import { formatNumber, formatScientific } from '@gapwise/contracts';
import { map, switchMap } from 'rxjs';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { CascadesApi } from '../cascades-api';

/** Cascades of the workspace: name, long-lived yield and lifetime, version; create a new one. */
@Component({
  selector: 'gw-cascade-list',
  imports: [RouterLink, MatButtonModule, MatIconModule],
  template: `
    <div class="gw-page">
      <header class="head">
        <h1 class="gw-title">Cascades</h1>
        <span class="spacer"></span>
        @if (workspace.canEdit()) {
          <a mat-flat-button class="new-cascade" [routerLink]="['/w', wid(), 'cascades', 'new']">
            <mat-icon aria-hidden="true" svgIcon="add"></mat-icon> New cascade
          </a>
        }
      </header>
      <p class="intro">
        A cascade is multi-step electron transfer as a network of states: excited states,
        charge-separated intermediates and final states joined by decays and electron-transfer
        steps. It gives the yield and lifetime of the long-lived charge separation.
      </p>
      @if (cascades(); as list) {
        @if (list.length) {
          <div class="table-wrap">
            <table class="gw-table cascades">
              <thead>
                <tr>
                  <th scope="col">Name</th>
                  <th scope="col" class="num">Long-lived yield</th>
                  <th scope="col" class="num">Lifetime</th>
                  <th scope="col" class="num">Version</th>
                  <th scope="col">Saved</th>
                </tr>
              </thead>
              <tbody>
                @for (c of list; track c.id) {
                  <tr>
                    <th scope="row">
                      <a [routerLink]="['/w', wid(), 'cascades', c.id]">{{ c.name }}</a>
                    </th>
                    <td class="num">{{ c.longLivedYield === null ? '—' : n(c.longLivedYield) }}</td>
                    <td class="num">
                      {{ c.longLivedLifetimeS === null ? '—' : s(c.longLivedLifetimeS) }}
                    </td>
                    <td class="num">{{ c.version }}</td>
                    <td>{{ date(c.updatedAt) }}</td>
                  </tr>
                }
              </tbody>
            </table>
          </div>
        } @else {
          <p class="muted">No cascades yet.</p>
        }
      } @else {
        <p class="muted">Loading…</p>
      }
    </div>
  `,
  styleUrl: '../cascades.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CascadeList {
  private readonly api = inject(CascadesApi);
  private readonly route = inject(ActivatedRoute);
  protected readonly workspace = inject(WorkspaceContext);
  protected readonly wid = toSignal(this.route.paramMap.pipe(map((p) => p.get('wid') ?? '')), {
    initialValue: '',
  });
  protected readonly cascades = toSignal(
    this.route.paramMap.pipe(switchMap((p) => this.api.list(p.get('wid') ?? ''))),
  );

  protected n(value: number): string {
    return formatNumber(value, 3);
  }

  protected s(seconds: number): string {
    return `${formatScientific(seconds, 3)} s`;
  }

  protected date(iso: string): string {
    return new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' });
  }
}
