import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import type { Pair, PairInput } from '@gapwise/contracts';
import { RichText } from '../../shared/rich-text/rich-text';
import { pairDifferences } from '../pair-diff';

export interface ConflictDialogData {
  readonly mine: PairInput;
  readonly theirs: Pair;
}

/** 'reload' takes the stored version; 'overwrite' saves mine over it knowingly. */
export type ConflictChoice = 'reload' | 'overwrite';

/** Someone saved this pair since it was opened: show what differs and let the user choose. */
@Component({
  selector: 'gw-conflict-dialog',
  imports: [MatDialogModule, MatButtonModule, RichText],
  template: `
    <h2 mat-dialog-title>This pair changed while you were editing</h2>
    <mat-dialog-content>
      <p>
        Version {{ data.theirs.version }} was saved
        @if (data.theirs.updatedBy) {
          by <strong>{{ data.theirs.updatedBy.displayName }}</strong>
        }
        after you opened the pair. These fields differ:
      </p>
      <table class="diff">
        <thead>
          <tr>
            <th scope="col">Field</th>
            <th scope="col">Your edit</th>
            <th scope="col">Saved version {{ data.theirs.version }}</th>
          </tr>
        </thead>
        <tbody>
          @for (row of rows; track row.field) {
            <tr>
              <th scope="row"><gw-rich-text [text]="row.field" /></th>
              <td class="mine">{{ row.left }}</td>
              <td class="theirs">{{ row.right }}</td>
            </tr>
          } @empty {
            <tr>
              <td colspan="3">No field differs; saving again is safe.</td>
            </tr>
          }
        </tbody>
      </table>
      <p class="hint">
        <strong>Reload</strong> discards your edit and shows version {{ data.theirs.version }}.
        <strong>Overwrite</strong> saves your edit as a new version; version
        {{ data.theirs.version }} stays in the history.
      </p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="undefined">Keep editing</button>
      <button mat-stroked-button type="button" [mat-dialog-close]="'reload'">
        Reload saved version
      </button>
      <button mat-flat-button type="button" class="overwrite" [mat-dialog-close]="'overwrite'">
        Overwrite with my edit
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    .diff {
      border-collapse: collapse;
      width: 100%;
      font-size: 13px;
    }
    .diff th,
    .diff td {
      text-align: left;
      padding: 6px 8px;
      border-bottom: 1px solid var(--mat-sys-outline-variant);
      vertical-align: top;
    }
    .mine {
      background: #e7f1fb;
    }
    .theirs {
      background: #fdf0e4;
    }
    .hint {
      font-size: 13px;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ConflictDialog {
  protected readonly data = inject<ConflictDialogData>(MAT_DIALOG_DATA);
  protected readonly rows = pairDifferences(this.data.mine, this.data.theirs, true);
}
