import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { PASSWORD_MIN_LENGTH } from '@gapwise/contracts';
import { apiErrorOf, applyFieldErrors } from '../api-errors';
import { registrationReturnUrl } from '../return-url';
import { Session } from '../session';
import { passwordFitsBcrypt } from '../password-rules';

@Component({
  selector: 'gw-register',
  imports: [
    ReactiveFormsModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
    MatIconModule,
    RouterLink,
  ],
  templateUrl: './register.html',
  styleUrl: '../auth-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Register {
  private readonly session = inject(Session);

  readonly returnUrl = input<string | undefined>();

  protected readonly minLength = PASSWORD_MIN_LENGTH;
  protected readonly form = new FormGroup({
    displayName: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    email: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.email],
    }),
    password: new FormControl('', {
      nonNullable: true,
      validators: [
        Validators.required,
        Validators.minLength(PASSWORD_MIN_LENGTH),
        passwordFitsBcrypt,
      ],
    }),
  });
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  /** Set once the request is accepted: the page then says to check the mailbox. */
  protected readonly sent = signal<{ email: string; message: string } | null>(null);

  /** Back to the form (a typo in the address, or the message did not come). */
  protected again(): void {
    this.sent.set(null);
  }

  protected register(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.failure.set(null);
    const returnUrl = registrationReturnUrl(this.returnUrl());
    const body = { ...this.form.getRawValue(), ...(returnUrl ? { returnUrl } : {}) };
    this.session.register(body).subscribe({
      next: (answer) => {
        this.busy.set(false);
        this.sent.set({ email: body.email.trim(), message: answer.message });
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
