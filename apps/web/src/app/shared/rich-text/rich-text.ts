import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { textRuns } from '@gapwise/contracts';

/**
 * Scientific text with true subscripts: labels, equations, calculation messages. The markup
 * (`H_AB`, `τ_L`, `k_{B}T`, `k_BT`) is the one the PDF report prints from (`textRuns` of
 * `@gapwise/contracts`); the rendered text reads without underscores (`|HAB|`).
 */
@Component({
  selector: 'gw-rich-text',
  template: `@for (run of runs(); track $index) {
    @if (run.sub) {
      <sub>{{ run.text }}</sub>
    } @else {
      <ng-container>{{ run.text }}</ng-container>
    }
  }`,
  styles: `
    :host {
      display: inline;
      white-space: inherit;
    }
    sub {
      font-size: 0.72em;
      line-height: 0;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RichText {
  readonly text = input<string | null | undefined>('');
  protected readonly runs = computed(() => textRuns(this.text() ?? ''));
}
