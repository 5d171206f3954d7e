import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import { POTENTIAL_SCALE_CODES, potentialScaleName, potentialToShe } from '@gapwise/contracts';
import { editableText } from '../../units/number-format';

/**
 * The reference electrode a potential is typed against (SHE, NHE, SCE, Ag/AgCl, Fc⁺/Fc in a
 * solvent). The number keeps its meaning on the picked scale; the hint shows it on the SHE scale
 * with the calculation core's published offsets (`drivingForce.reference`), as it is stored.
 */
@Component({
  selector: 'gw-reference-picker',
  imports: [MatFormFieldModule, MatSelectModule],
  template: `
    <mat-form-field class="reference" subscriptSizing="dynamic">
      <mat-label>Reference</mat-label>
      <mat-select
        class="reference-select"
        [value]="code()"
        [disabled]="readonly()"
        (selectionChange)="codeChange.emit($event.value)"
        [aria-label]="'Reference electrode of ' + label()"
      >
        <mat-option value="">not stated</mat-option>
        @for (c of codes; track c) {
          <mat-option [value]="c">{{ name(c) }}</mat-option>
        }
      </mat-select>
      @if (echo(); as e) {
        <mat-hint class="she-echo">{{ e }}</mat-hint>
      }
    </mat-form-field>
  `,
  styles: `
    :host {
      display: block;
    }
    .reference {
      width: 100%;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReferencePicker {
  /** Scale code (`SCE`, `Fc/MeCN`), '' when not stated. */
  readonly code = input('');
  /** The potential's value on the picked scale, V (null when empty). */
  readonly valueV = input<number | null>(null);
  /** Plain label of the potential, for the aria-label. */
  readonly label = input('the potential');
  readonly readonly = input(false);
  readonly codeChange = output<string>();

  protected readonly codes = POTENTIAL_SCALE_CODES;
  protected readonly name = potentialScaleName;

  /** "= 0.641 V vs SHE": what is stored, so the conversion can be checked at a glance. */
  protected readonly echo = computed(() => {
    const code = this.code();
    const v = this.valueV();
    if (!code || v === null || code === 'SHE') return null;
    return `= ${editableText(Number(potentialToShe(v, code).toFixed(4)))} V vs SHE`;
  });
}
