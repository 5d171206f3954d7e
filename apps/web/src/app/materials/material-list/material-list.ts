import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { ActivatedRoute, RouterLink } from '@angular/router';
import { formatNumber } from '@gapwise/contracts';
import { map, switchMap } from 'rxjs';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { MaterialsApi } from '../materials-api';

/** Material cases (charge transport by hopping) of the workspace. */
@Component({
  selector: 'gw-material-list',
  imports: [RouterLink, MatButtonModule, MatIconModule],
  template: `
    <div class="gw-page">
      <header class="head">
        <h1 class="gw-title">Materials</h1>
        <span class="spacer"></span>
        @if (workspace.canEdit()) {
          <a mat-flat-button [routerLink]="['/w', wid(), 'materials', 'new']">
            <mat-icon aria-hidden="true" svgIcon="add"></mat-icon> New material
          </a>
        }
      </header>
      <p class="muted">
        Charge transport by hopping: Marcus rates to the neighbours of a site, the diffusion
        coefficient and the Einstein mobility (tensor when displacement vectors are given).
      </p>
      @if (materials(); as list) {
        @if (list.length) {
          <div class="scroll">
            <table class="gw-table material-table">
              <thead>
                <tr>
                  <th scope="col">Name</th>
                  <th scope="col" class="num">Neighbours</th>
                  <th scope="col" class="num">λ / eV</th>
                  <th scope="col" class="num">T / K</th>
                  <th scope="col" class="num">μ / cm² V⁻¹ s⁻¹</th>
                </tr>
              </thead>
              <tbody>
                @for (m of list; track m.id) {
                  <tr>
                    <th scope="row">
                      <a [routerLink]="['/w', wid(), 'materials', m.id]">{{ m.name }}</a>
                    </th>
                    <td class="num">{{ m.neighbourCount }}</td>
                    <td class="num">{{ m.lambdaEv }}</td>
                    <td class="num">{{ m.temperatureK }}</td>
                    <td class="num">{{ fmt(m.mobility) }}</td>
                  </tr>
                }
              </tbody>
            </table>
          </div>
        } @else {
          <p class="muted">No material cases yet.</p>
        }
      } @else {
        <p class="muted">Loading…</p>
      }
    </div>
  `,
  styleUrl: '../materials.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MaterialList {
  private readonly api = inject(MaterialsApi);
  private readonly route = inject(ActivatedRoute);
  protected readonly workspace = inject(WorkspaceContext);
  protected readonly wid = toSignal(this.route.paramMap.pipe(map((p) => p.get('wid') ?? '')), {
    initialValue: '',
  });
  protected readonly materials = toSignal(
    this.route.paramMap.pipe(switchMap((p) => this.api.list(p.get('wid') ?? ''))),
  );

  protected fmt(x: number | null): string {
    return formatNumber(x, 3);
  }
}
