import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { apiErrorOf } from '../api-errors';
import { safeReturnUrl } from '../return-url';
import { Session } from '../session';

@Component({
  selector: 'gw-sign-in',
  imports: [
    ReactiveFormsModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
    MatIconModule,
    RouterLink,
  ],
  templateUrl: './sign-in.html',
  styleUrl: '../auth-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SignIn {
  private readonly session = inject(Session);
  private readonly router = inject(Router);

  /** Query parameters, bound by the router. */
  readonly returnUrl = input<string | undefined>();
  readonly expired = input<string | undefined>();

  protected readonly form = new FormGroup({
    email: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.email],
    }),
    password: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
  });
  /** A message handed over by the page that sent the user here (the account deletion says what went). */
  protected readonly notice = (() => {
    const state = this.router.currentNavigation()?.extras.state as { notice?: unknown } | undefined;
    return typeof state?.notice === 'string' ? state.notice : null;
  })();
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);

  protected signIn(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.failure.set(null);
    this.session.signIn(this.form.getRawValue()).subscribe({
      next: () => void this.router.navigateByUrl(safeReturnUrl(this.returnUrl())),
      error: (err: unknown) => {
        this.busy.set(false);
        this.failure.set(apiErrorOf(err).message);
      },
    });
  }
}
