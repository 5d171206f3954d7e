import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { RichText } from '../../shared/rich-text/rich-text';
import { AdiabaticSide } from '../adiabatic-side/adiabatic-side';
import { ParameterField } from '../parameter-field/parameter-field';
import { ResultsPanel } from '../results-panel/results-panel';
import { UnitChangeNote } from '../unit-change-note/unit-change-note';
import { PairEditorHeader } from './parts/pair-editor-header';
import { PairPlots } from './parts/pair-plots';
import { PairEditorStore } from './pair-editor-store';
import type { HoldsUnsavedChanges } from './unsaved-changes-guard';

export { REDRAW_MEASURE } from './pair-editor-store';

/**
 * The pair workbench page: typed inputs with units and provenance, live results and plots. The
 * state and every action live in `PairEditorStore`; the header, the plots and the results are
 * presentational parts fed from it.
 */
@Component({
  selector: 'gw-pair-editor',
  imports: [
    AdiabaticSide,
    ReactiveFormsModule,
    MatButtonModule,
    MatIconModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatExpansionModule,
    PairEditorHeader,
    PairPlots,
    ParameterField,
    UnitChangeNote,
    ResultsPanel,
    RichText,
  ],
  providers: [PairEditorStore],
  templateUrl: './pair-editor.html',
  styleUrl: './pair-editor.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '(window:beforeunload)': 'warnBeforeUnload($event)' },
})
export class PairEditor implements HoldsUnsavedChanges {
  protected readonly store = inject(PairEditorStore);

  /** Route parameters (`pairId` absent on /pairs/new). */
  readonly wid = input.required<string>();
  readonly pairId = input<string | undefined>();

  constructor() {
    this.store.bind(this.wid, this.pairId);
  }

  hasUnsavedChanges(): boolean {
    return this.store.hasUnsavedChanges();
  }

  protected warnBeforeUnload(event: BeforeUnloadEvent): void {
    if (this.hasUnsavedChanges()) event.preventDefault();
  }
}
