import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { apiErrorOf, applyFieldErrors } from '../api-errors';
import { Session } from '../session';

/** "Forgot password?": asks for a reset link by e-mail (the answer never says whether an account exists). */
@Component({
  selector: 'gw-forgot-password',
  imports: [
    ReactiveFormsModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
    MatIconModule,
    RouterLink,
  ],
  templateUrl: './forgot-password.html',
  styleUrl: '../auth-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ForgotPassword {
  private readonly session = inject(Session);

  protected readonly form = new FormGroup({
    email: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.email],
    }),
  });
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly sent = signal<{ email: string; message: string } | null>(null);

  protected again(): void {
    this.sent.set(null);
  }

  protected send(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.failure.set(null);
    const email = this.form.getRawValue().email.trim();
    this.session.requestPasswordReset(email).subscribe({
      next: (answer) => {
        this.busy.set(false);
        this.sent.set({ email, message: answer.message });
      },
      error: (err: unknown) => {
        this.busy.set(false);
        const error = apiErrorOf(err);
        const rest = applyFieldErrors(this.form, error);
        this.failure.set(
          error.fields?.length && rest.length === 0 ? null : [error.message, ...rest].join(' '),
        );
      },
    });
  }
}
