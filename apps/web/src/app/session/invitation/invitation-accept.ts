import { HttpClient, HttpContext } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, OnInit, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import type { Role } from '@gapwise/contracts';
import { switchMap } from 'rxjs';
import { QUIET_ERRORS, apiErrorOf } from '../api-errors';
import { Session } from '../session';

/** What `GET /api/invitations/:token` tells before accepting (fields read defensively). */
interface InvitationPreview {
  readonly workspaceName?: string;
  readonly workspaceId?: string;
  readonly email?: string;
  readonly role?: Role;
  readonly status?: string;
  readonly invitedBy?: string | null;
}

@Component({
  selector: 'gw-invitation-accept',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink],
  templateUrl: './invitation-accept.html',
  styleUrl: '../auth-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InvitationAccept implements OnInit {
  private readonly http = inject(HttpClient);
  private readonly router = inject(Router);
  protected readonly session = inject(Session);

  /** Route parameter. */
  readonly token = input.required<string>();

  protected readonly preview = signal<InvitationPreview | null>(null);
  protected readonly failure = signal<string | null>(null);
  protected readonly busy = signal(true);

  ngOnInit(): void {
    const context = new HttpContext().set(QUIET_ERRORS, true);
    this.session
      .ensureLoaded()
      .pipe(
        switchMap(() =>
          this.http.get<InvitationPreview>(`/api/invitations/${encodeURIComponent(this.token())}`, {
            context,
          }),
        ),
      )
      .subscribe({
        next: (p) => {
          this.preview.set(p);
          this.busy.set(false);
        },
        error: (err: unknown) => {
          this.failure.set(apiErrorOf(err).message);
          this.busy.set(false);
        },
      });
  }

  protected returnUrl(): string {
    return `/invitations/${this.token()}`;
  }

  protected accept(): void {
    this.busy.set(true);
    this.failure.set(null);
    const context = new HttpContext().set(QUIET_ERRORS, true);
    this.http
      .post<{ workspaceId?: string }>(
        `/api/invitations/${encodeURIComponent(this.token())}/accept`,
        {},
        { context },
      )
      .pipe(switchMap((answer) => this.session.reload().pipe(switchMap(async () => answer))))
      .subscribe({
        next: (answer) => {
          const wid = answer?.workspaceId ?? this.preview()?.workspaceId;
          void this.router.navigateByUrl(wid ? `/w/${wid}/pairs` : '/');
        },
        error: (err: unknown) => {
          this.busy.set(false);
          this.failure.set(apiErrorOf(err).message);
        },
      });
  }
}
