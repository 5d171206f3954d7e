import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  effect,
  inject,
  input,
  output,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { UnitChange } from '../pair-form/quantity-control';

/** How long the note stays up: long enough to read it and reach Undo. */
export const UNIT_CHANGE_NOTE_MS = 12_000;

/**
 * The short note under a field after its unit changed: what happened to the number
 * ("25 K → −248.15 °C", or "25 is now read as 25 °C (= 298.15 K)") and an Undo button.
 * The parent owns the change; the note asks it to clear after a while or after Undo.
 */
@Component({
  selector: 'gw-unit-change-note',
  imports: [MatButtonModule],
  template: `@if (change(); as c) {
    <p class="unit-change" role="status" [attr.data-mode]="c.mode">
      <span class="unit-change-text">{{ c.message }}</span>
      <button mat-button type="button" class="unit-change-undo" (click)="undo(c)">Undo</button>
    </p>
  }`,
  styles: `
    .unit-change {
      display: flex;
      align-items: center;
      flex-wrap: wrap;
      gap: 4px 8px;
      margin: 0 0 6px;
      padding: 2px 4px 2px 10px;
      border-left: 3px solid var(--gw-accent, #b26a00);
      background: var(--gw-accent-soft, #fff4e0);
      font: var(--mat-sys-body-small);
      font-variant-numeric: tabular-nums;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UnitChangeNote {
  readonly change = input<UnitChange | null>(null);
  /** The parent should drop the change (timed out, or undone). */
  readonly cleared = output<void>();
  /** Fired after Undo restored the previous unit and number. */
  readonly undone = output<void>();

  private timer: ReturnType<typeof setTimeout> | null = null;

  constructor() {
    effect(() => {
      const c = this.change();
      if (this.timer) clearTimeout(this.timer);
      this.timer = c ? setTimeout(() => this.cleared.emit(), UNIT_CHANGE_NOTE_MS) : null;
    });
    inject(DestroyRef).onDestroy(() => {
      if (this.timer) clearTimeout(this.timer);
    });
  }

  protected undo(c: UnitChange): void {
    c.undo();
    this.undone.emit();
    this.cleared.emit();
  }
}
