import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { formatMeasured } from '@gapwise/contracts';
import { ActivatedRoute, RouterLink } from '@angular/router';
import { map, switchMap } from 'rxjs';
import { ElectrodeApi } from './electrode-api';

/** Electrode cases of the workspace. */
@Component({
  selector: 'gw-electrode-list',
  imports: [RouterLink],
  template: `
    <div class="gw-page">
      <header class="head">
        <h1 class="gw-title">Electrodes</h1>
      </header>
      <p class="muted">
        Electron transfer at an electrode: Marcus–Hush–Chidsey and Butler–Volmer rates against
        overpotential, and fits of λ, k⁰ and α to measured k(η).
      </p>
      @if (cases(); as list) {
        @if (list.length) {
          <div class="table-scroll">
            <table class="gw-table electrode-table">
              <thead>
                <tr>
                  <th scope="col">Name</th>
                  <th scope="col">Couple · electrode</th>
                  <th scope="col" class="num">λ / eV</th>
                  <th scope="col" class="num">k⁰</th>
                  <th scope="col" class="num">Points</th>
                  <th scope="col" class="num">Version</th>
                </tr>
              </thead>
              <tbody>
                @for (c of list; track c.id) {
                  <tr>
                    <th scope="row">
                      <a [routerLink]="['/w', wid(), 'electrodes', c.id]">{{ c.name }}</a>
                    </th>
                    <td>{{ c.redoxCouple }} · {{ c.electrode }}</td>
                    <td class="num">{{ fmt(c.lambdaEv) }}</td>
                    <td class="num">
                      {{ c.k0 === null ? 'from |H|, ρ_M' : fmt(c.k0) + ' ' + c.rateUnit }}
                    </td>
                    <td class="num">{{ c.pointCount }}</td>
                    <td class="num">v{{ c.version }}</td>
                  </tr>
                }
              </tbody>
            </table>
          </div>
        } @else {
          <p class="muted">No electrode cases yet.</p>
        }
      } @else {
        <p class="muted">Loading…</p>
      }
    </div>
  `,
  styleUrl: './electrodes.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ElectrodeList {
  private readonly api = inject(ElectrodeApi);
  private readonly route = inject(ActivatedRoute);
  protected readonly wid = toSignal(this.route.paramMap.pipe(map((p) => p.get('wid') ?? '')), {
    initialValue: '',
  });
  protected readonly cases = toSignal(
    this.route.paramMap.pipe(switchMap((p) => this.api.list(p.get('wid') ?? ''))),
  );
  protected fmt(value: number): string {
    return formatMeasured(value);
  }
}
