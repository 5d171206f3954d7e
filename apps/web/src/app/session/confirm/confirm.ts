import { ChangeDetectionStrategy, Component, OnInit, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { apiErrorOf } from '../api-errors';
import { safeReturnUrl } from '../return-url';
import { Session } from '../session';

/**
 * The page of the e-mailed `/confirm/:token` link: confirms the registration (the account is
 * created and signed in) and opens the app, or the page the registration started from.
 */
@Component({
  selector: 'gw-confirm',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink],
  templateUrl: './confirm.html',
  styleUrl: '../auth-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Confirm implements OnInit {
  private readonly session = inject(Session);
  private readonly router = inject(Router);

  /** Route parameter and query parameter, bound by the router. */
  readonly token = input.required<string>();
  readonly returnUrl = input<string | undefined>();

  protected readonly busy = signal(true);
  protected readonly failure = signal<{ code: string; message: string } | null>(null);

  ngOnInit(): void {
    this.session.confirm(this.token()).subscribe({
      next: () => void this.router.navigateByUrl(safeReturnUrl(this.returnUrl())),
      error: (err: unknown) => {
        const error = apiErrorOf(err);
        this.busy.set(false);
        this.failure.set({ code: error.code, message: error.message });
      },
    });
  }
}
