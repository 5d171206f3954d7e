import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import type { Pair } from '@gapwise/contracts';

/** Title, version chip, "Unsaved changes" and the page's actions (history, reports, save). */
@Component({
  selector: 'gw-pair-editor-header',
  imports: [RouterLink, MatButtonModule, MatIconModule],
  template: `
    <header class="head">
      <a mat-icon-button [routerLink]="['/w', wid(), 'pairs']" aria-label="Back to the pairs table">
        <mat-icon aria-hidden="true" svgIcon="arrow_back"></mat-icon>
      </a>
      <h1 class="gw-title">
        {{ isNew() ? 'New pair' : (pair()?.name ?? 'Pair') }}
        @if (pair(); as p) {
          <span class="version">v{{ p.version }}</span>
        }
      </h1>
      @if (dirty() && !readOnly()) {
        <span class="unsaved" role="status">Unsaved changes</span>
      }
      <span class="spacer"></span>
      @if (pair(); as p) {
        <a mat-button [routerLink]="['/w', wid(), 'pairs', p.id, 'history']">
          <mat-icon aria-hidden="true" svgIcon="history"></mat-icon> Version history
        </a>
        <a mat-button [routerLink]="['/w', wid(), 'pairs', p.id, 'solvents']">
          <mat-icon aria-hidden="true" svgIcon="functions"></mat-icon> Solvent choice
        </a>
        <a mat-button [routerLink]="['/w', wid(), 'reports']" [queryParams]="{ pairId: p.id }">
          <mat-icon aria-hidden="true" svgIcon="description"></mat-icon> Reports
        </a>
        @if (!readOnly()) {
          <a
            mat-button
            [routerLink]="['/w', wid(), 'reports', 'new']"
            [queryParams]="{ pairId: p.id }"
          >
            <mat-icon aria-hidden="true" svgIcon="post_add"></mat-icon> Create report
          </a>
        }
      }
      @if (!readOnly()) {
        <button
          mat-flat-button
          type="button"
          class="save"
          (click)="save.emit()"
          [disabled]="saving()"
        >
          <mat-icon aria-hidden="true" svgIcon="save"></mat-icon>
          {{ isNew() ? 'Create pair' : 'Save' }}
        </button>
      }
    </header>
  `,
  styles: `
    .head {
      display: flex;
      align-items: center;
      gap: 8px;
      flex-wrap: wrap;

      h1 {
        margin: 8px 0;
      }
    }

    .version {
      margin-left: 8px;
      padding: 1px 8px;
      border-radius: 10px;
      font-size: 13px;
      background: var(--mat-sys-surface-container-high);
      vertical-align: middle;
    }

    .unsaved {
      padding: 2px 10px;
      border-radius: 10px;
      background: #fff1d6;
      color: #5c3b00;
      font: var(--mat-sys-label-medium);
    }

    .spacer {
      flex: 1;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PairEditorHeader {
  readonly wid = input.required<string>();
  readonly pair = input<Pair | null>(null);
  readonly isNew = input(true);
  readonly dirty = input(false);
  readonly readOnly = input(false);
  readonly saving = input(false);
  readonly save = output<void>();
}
