import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { RouterLink } from '@angular/router';
import { provenanceHref, provenanceParts, type Provenance } from '@gapwise/contracts';
import { RichText } from '../rich-text/rich-text';

/**
 * A value's provenance as the sentence of `provenanceParts` (the PDF prints the same words): the
 * trace analysis, series or screen it came from is a link into the workspace.
 */
@Component({
  selector: 'gw-provenance-sentence',
  imports: [RouterLink, RichText],
  template: `@for (part of parts(); track $index) {
    @if (part.link) {
      <a [routerLink]="href(part.link)">
        @if (part.verbatim) {
          <span>{{ part.text }}</span>
        } @else {
          <gw-rich-text [text]="part.text" />
        }
      </a>
    } @else if (part.verbatim) {
      <span>{{ part.text }}</span>
    } @else {
      <gw-rich-text [text]="part.text" />
    }
  }`,
  styles: `
    :host {
      display: inline;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProvenanceSentence {
  readonly provenance = input.required<Provenance>();
  readonly workspaceId = input.required<string>();
  protected readonly parts = computed(() => provenanceParts(this.provenance()));

  protected href(link: NonNullable<ReturnType<typeof provenanceParts>[number]['link']>): string {
    return provenanceHref(link, this.workspaceId());
  }
}
