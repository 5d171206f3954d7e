import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { PASSWORD_MIN_LENGTH } from '@gapwise/contracts';
import { apiErrorOf, applyFieldErrors } from '../api-errors';
import { Session } from '../session';
import { passwordFitsBcrypt } from '../password-rules';

/**
 * The page of the e-mailed `/reset-password/:token` link: a new password, then the app, signed
 * in afresh (every other session of the account has ended).
 */
@Component({
  selector: 'gw-reset-password',
  imports: [
    ReactiveFormsModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
    MatIconModule,
    RouterLink,
  ],
  templateUrl: './reset-password.html',
  styleUrl: '../auth-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ResetPassword {
  private readonly session = inject(Session);
  private readonly router = inject(Router);

  /** Route parameter, bound by the router. */
  readonly token = input.required<string>();

  protected readonly minLength = PASSWORD_MIN_LENGTH;
  protected readonly form = new FormGroup({
    newPassword: new FormControl('', {
      nonNullable: true,
      validators: [
        Validators.required,
        Validators.minLength(PASSWORD_MIN_LENGTH),
        passwordFitsBcrypt,
      ],
    }),
  });
  protected readonly busy = signal(false);
  protected readonly failure = signal<{ code: string; message: string } | null>(null);

  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.failure.set(null);
    this.session
      .confirmPasswordReset({
        token: this.token(),
        newPassword: this.form.getRawValue().newPassword,
      })
      .subscribe({
        next: () => void this.router.navigateByUrl('/'),
        error: (err: unknown) => {
          this.busy.set(false);
          const error = apiErrorOf(err);
          const rest = applyFieldErrors(this.form, error);
          if (!error.fields?.length || rest.length)
            this.failure.set({ code: error.code, message: [error.message, ...rest].join(' ') });
        },
      });
  }
}
