import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatDividerModule } from '@angular/material/divider';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatToolbarModule } from '@angular/material/toolbar';
import { MatTooltipModule } from '@angular/material/tooltip';
import { Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { Session } from '../session/session';
import { NewWorkspaceDialog } from '../workspaces/new-workspace/new-workspace-dialog';
import { WorkspaceContext } from '../workspaces/workspace-context';

/** App bar (product name, workspace switcher, sections, user menu) around the signed-in pages. */
@Component({
  selector: 'gw-shell',
  imports: [
    RouterOutlet,
    RouterLink,
    RouterLinkActive,
    MatToolbarModule,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    MatDividerModule,
    MatTooltipModule,
  ],
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Shell {
  protected readonly session = inject(Session);
  protected readonly workspace = inject(WorkspaceContext);
  private readonly router = inject(Router);
  private readonly dialog = inject(MatDialog);

  protected switchTo(workspaceId: string): void {
    void this.router.navigate(['/w', workspaceId, 'pairs']);
  }

  protected createWorkspace(): void {
    this.dialog
      .open(NewWorkspaceDialog)
      .afterClosed()
      .subscribe((ws) => {
        if (!ws) return;
        this.session.reload().subscribe(() => this.switchTo(ws.id));
      });
  }

  protected signOut(): void {
    this.session.signOut().subscribe(() => void this.router.navigate(['/sign-in']));
  }

  /** Ends every session of the account on the server, this one included. */
  protected signOutEverywhere(): void {
    this.session.signOutEverywhere().subscribe({
      next: () => void this.router.navigate(['/sign-in']),
    });
  }

  protected skipToContent(event: Event): void {
    event.preventDefault();
    document.getElementById('gw-main')?.focus();
  }
}
