import { Routes } from '@angular/router';
import { PairEditor } from './pair-editor';
import { unsavedChangesGuard } from './unsaved-changes-guard';

export const editorRoutes: Routes = [
  { path: '', component: PairEditor, canDeactivate: [unsavedChangesGuard] },
];
