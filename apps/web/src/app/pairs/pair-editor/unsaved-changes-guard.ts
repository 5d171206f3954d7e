import type { CanDeactivateFn } from '@angular/router';

/** A page that may hold edits not yet saved. */
export interface HoldsUnsavedChanges {
  hasUnsavedChanges(): boolean;
}

/** Asks before leaving a page with unsaved edits. */
export const unsavedChangesGuard: CanDeactivateFn<HoldsUnsavedChanges> = (component) =>
  !component.hasUnsavedChanges() ||
  confirm('This pair has unsaved changes. Leave and discard them?');
