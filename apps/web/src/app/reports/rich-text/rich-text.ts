import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';

/** One run of report text: plain, or a subscript. */
export interface TextRun {
  readonly text: string;
  readonly sub: boolean;
}

/**
 * Splits report text into runs the way the PDF prints it: `H_AB`, `τ_L`, `ε_s` (the
 * alphanumeric run after `_`) and `k_{B}T` (`_{…}` for longer ones) become subscripts.
 */
export function textRuns(text: string): TextRun[] {
  const runs: TextRun[] = [];
  const re = /_\{([^}]*)\}|_([A-Za-z0-9]+)/g;
  let last = 0;
  for (let m = re.exec(text); m; m = re.exec(text)) {
    if (m.index > last) runs.push({ text: text.slice(last, m.index), sub: false });
    runs.push({ text: m[1] ?? m[2] ?? '', sub: true });
    last = m.index + m[0].length;
  }
  if (last < text.length) runs.push({ text: text.slice(last), sub: false });
  return runs;
}

/** Report text with true subscripts (labels, equations, reasons), as in the PDF. */
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
