import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { Router } from '@angular/router';
import { Session } from '../../session/session';
import { NewWorkspaceDialog } from '../new-workspace/new-workspace-dialog';

@Component({
  selector: 'gw-no-workspace',
  imports: [MatButtonModule],
  template: `
    <div class="gw-page">
      <h1 class="gw-title">No workspace yet</h1>
      <p>
        You are not a member of any workspace. Ask a workspace owner to invite you by e-mail, or
        start your own workspace and invite your group.
      </p>
      <button mat-flat-button type="button" (click)="createWorkspace()">Start a workspace</button>
    </div>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NoWorkspace {
  private readonly dialog = inject(MatDialog);
  private readonly session = inject(Session);
  private readonly router = inject(Router);

  protected createWorkspace(): void {
    this.dialog
      .open(NewWorkspaceDialog)
      .afterClosed()
      .subscribe((ws) => {
        if (!ws) return;
        this.session.reload().subscribe(() => void this.router.navigate(['/w', ws.id, 'pairs']));
      });
  }
}
