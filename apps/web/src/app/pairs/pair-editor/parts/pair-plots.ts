import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatTabsModule } from '@angular/material/tabs';
import type { CalcRequest } from '@gapwise/calc';
import type { DrivingForceInputs } from '@gapwise/plots';
import { DrivingForcePlot } from '../../../plots/driving-force-plot/driving-force-plot';
import { ParabolaPlot } from '../../../plots/parabola-plot/parabola-plot';
import { TemperaturePlot } from '../../../plots/temperature-plot/temperature-plot';

/** The pair's three plots in tabs: free-energy curves, rate vs ΔG° and rate vs temperature. */
@Component({
  selector: 'gw-pair-plots',
  imports: [MatTabsModule, ParabolaPlot, DrivingForcePlot, TemperaturePlot],
  template: `
    <section class="card plots" aria-label="Plots">
      <mat-tab-group mat-stretch-tabs="false" animationDuration="0ms">
        <mat-tab label="Free-energy curves">
          <gw-parabola-plot
            [deltaG0]="deltaG0()"
            [lambda]="lambda()"
            [coupling]="coupling()"
            [filename]="fileStem() + '-curves'"
            (redrawn)="redrawn.emit()"
          />
        </mat-tab>
        <mat-tab label="Rate vs driving force">
          <ng-template matTabContent>
            <gw-driving-force-plot
              [inputs]="drivingInputs()"
              [model]="model()"
              [filename]="fileStem() + '-driving-force'"
              (redrawn)="redrawn.emit()"
            />
          </ng-template>
        </mat-tab>
        <mat-tab label="Rate vs temperature">
          <ng-template matTabContent>
            <gw-temperature-plot
              [request]="rateRequest()"
              [temperature]="temperature()"
              [filename]="fileStem() + '-arrhenius'"
              (redrawn)="redrawn.emit()"
            />
          </ng-template>
        </mat-tab>
      </mat-tab-group>
    </section>
  `,
  styles: `
    .card {
      padding: 14px 18px;
      border-radius: 14px;
      background: var(--mat-sys-surface-container-lowest);
      border: 1px solid var(--mat-sys-outline-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PairPlots {
  /** eV; null when not given yet. */
  readonly deltaG0 = input<number | null>(null);
  readonly lambda = input<number | null>(null);
  readonly coupling = input<number | null>(null);
  readonly drivingInputs = input<DrivingForceInputs | null>(null);
  readonly model = input<string>('marcus');
  readonly rateRequest = input<CalcRequest | null>(null);
  /** K. */
  readonly temperature = input<number | null>(null);
  readonly fileStem = input('new-pair');
  /** A plot finished drawing (closes the keystroke-to-redraw measurement). */
  readonly redrawn = output<void>();
}
