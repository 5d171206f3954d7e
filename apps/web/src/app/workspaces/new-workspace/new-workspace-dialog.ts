import { HttpClient, HttpContext } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { WorkspaceSummary } from '@gapwise/contracts';
import { QUIET_ERRORS, apiErrorOf } from '../../session/api-errors';

/** Creates a workspace (the creator becomes its owner); closes with the new workspace. */
@Component({
  selector: 'gw-new-workspace-dialog',
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
  ],
  template: `
    <h2 mat-dialog-title>New workspace</h2>
    <form (ngSubmit)="create()">
      <mat-dialog-content>
        <mat-form-field style="width: 100%">
          <mat-label>Workspace name</mat-label>
          <input matInput [formControl]="name" required cdkFocusInitial />
          @if (name.hasError('required')) {
            <mat-error>Name is required.</mat-error>
          } @else if (name.hasError('api')) {
            <mat-error>{{ name.getError('api') }}</mat-error>
          }
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy()">Create</button>
      </mat-dialog-actions>
    </form>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NewWorkspaceDialog {
  private readonly http = inject(HttpClient);
  private readonly ref = inject<MatDialogRef<NewWorkspaceDialog, WorkspaceSummary>>(MatDialogRef);
  protected readonly name = new FormControl('', {
    nonNullable: true,
    validators: [Validators.required],
  });
  protected readonly busy = signal(false);

  protected create(): void {
    if (this.name.invalid) {
      this.name.markAsTouched();
      return;
    }
    this.busy.set(true);
    const context = new HttpContext().set(QUIET_ERRORS, true);
    this.http
      .post<WorkspaceSummary>('/api/workspaces', { name: this.name.value.trim() }, { context })
      .subscribe({
        next: (ws) => this.ref.close(ws),
        error: (err: unknown) => {
          this.busy.set(false);
          const error = apiErrorOf(err);
          this.name.setErrors({ api: error.fields?.[0]?.message ?? error.message });
          this.name.markAsTouched();
        },
      });
  }
}
