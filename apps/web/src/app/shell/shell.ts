import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  ElementRef,
  inject,
  signal,
  viewChild,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatDividerModule } from '@angular/material/divider';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatToolbarModule } from '@angular/material/toolbar';
import { MatTooltipModule } from '@angular/material/tooltip';
import { NavigationEnd, Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { filter } from 'rxjs';
import { Session } from '../session/session';
import { NewWorkspaceDialog } from '../workspaces/new-workspace/new-workspace-dialog';
import { WorkspaceContext } from '../workspaces/workspace-context';

/**
 * App bar (product name, workspace switcher, sections, user menu) around the signed-in pages.
 * On narrow screens (below 1100 px, see shell.scss) the sections fold behind a menu button and
 * open as a panel under the bar; a navigation, Escape or a second press closes it.
 */
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
  private readonly navButton = viewChild<unknown, ElementRef<HTMLElement>>('navButton', {
    read: ElementRef,
  });

  /** Whether the folded navigation panel is open (narrow screens only). */
  protected readonly navOpen = signal(false);

  constructor() {
    this.router.events
      .pipe(
        filter((e) => e instanceof NavigationEnd),
        takeUntilDestroyed(inject(DestroyRef)),
      )
      .subscribe(() => this.navOpen.set(false));
  }

  protected toggleNav(): void {
    this.navOpen.update((open) => !open);
  }

  /** Closes the panel; after Escape, focus goes back to the menu button that opened it. */
  protected closeNav(returnFocus: boolean): void {
    if (!this.navOpen()) return;
    this.navOpen.set(false);
    if (returnFocus) this.navButton()?.nativeElement.focus();
  }

  protected switchTo(workspaceId: string): void {
    void this.router.navigate(['/w', workspaceId, 'pairs']);
  }

  protected createWorkspace(): void {
    this.dialog
      // Opened from a menu item that is gone when the dialog closes: focus returns to the
      // workspace switcher that opened the menu.
      .open(NewWorkspaceDialog, { restoreFocus: '.app-bar .workspace-switch' })
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
