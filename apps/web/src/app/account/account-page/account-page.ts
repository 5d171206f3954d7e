import { ChangeDetectionStrategy, Component, effect, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { Router } from '@angular/router';
import { PASSWORD_MIN_LENGTH } from '@gapwise/contracts';
import { apiErrorOf, applyFieldErrors } from '../../session/api-errors';
import { passwordFitsBcrypt } from '../../session/password-rules';
import { Session } from '../../session/session';
import { ApiTokens } from '../api-tokens/api-tokens';

type Outcome = { ok: boolean; message: string } | null;

/** What the sign-in page says after a deletion: the account, and the workspaces that went with it. */
export function deletedAccountNotice(deletedWorkspaces: readonly string[]): string {
  if (deletedWorkspaces.length === 0) {
    return 'Your account was deleted. No workspace was deleted with it: in shared workspaces your membership ended and your work stays.';
  }
  const names = deletedWorkspaces.map((n) => `“${n}”`).join(', ');
  const one = deletedWorkspaces.length === 1;
  return `Your account was deleted, and with it ${one ? 'the workspace' : 'the workspaces'} where you were the only member: ${names}.`;
}

/** The signed-in person's account: name, password, sessions, API tokens, deletion. */
@Component({
  selector: 'gw-account-page',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    ApiTokens,
  ],
  templateUrl: './account-page.html',
  styleUrl: './account-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AccountPage {
  protected readonly session = inject(Session);
  private readonly router = inject(Router);

  protected readonly minLength = PASSWORD_MIN_LENGTH;
  protected readonly nameForm = new FormGroup({
    displayName: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
  });
  protected readonly passwordForm = new FormGroup({
    currentPassword: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    newPassword: new FormControl('', {
      nonNullable: true,
      validators: [
        Validators.required,
        Validators.minLength(PASSWORD_MIN_LENGTH),
        passwordFitsBcrypt,
      ],
    }),
  });
  protected readonly deleteForm = new FormGroup({
    password: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
  });
  protected readonly nameOutcome = signal<Outcome>(null);
  protected readonly passwordOutcome = signal<Outcome>(null);
  protected readonly deleteFailure = signal<string | null>(null);
  protected readonly busy = signal(false);

  constructor() {
    // The form starts from the current name (and follows it after a save).
    effect(() => {
      const name = this.session.user()?.displayName;
      if (name !== undefined) this.nameForm.controls.displayName.setValue(name);
    });
  }

  protected saveName(): void {
    const name = this.nameForm.controls.displayName.value.trim();
    if (!name) {
      this.nameForm.controls.displayName.setErrors({ required: true });
      this.nameForm.markAllAsTouched();
      return;
    }
    this.nameOutcome.set(null);
    this.session.updateDisplayName(name).subscribe({
      next: () => this.nameOutcome.set({ ok: true, message: 'Name saved.' }),
      error: (err: unknown) => this.fail(this.nameForm, err, this.nameOutcome),
    });
  }

  protected changePassword(): void {
    if (this.passwordForm.invalid) {
      this.passwordForm.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.passwordOutcome.set(null);
    this.session.changePassword(this.passwordForm.getRawValue()).subscribe({
      next: ({ endedSessions }) => {
        this.busy.set(false);
        this.passwordForm.reset();
        this.passwordOutcome.set({
          ok: true,
          message:
            endedSessions === 0
              ? 'Password changed. You were signed in nowhere else.'
              : `Password changed. ${endedSessions} other ${endedSessions === 1 ? 'session was' : 'sessions were'} signed out.`,
        });
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.fail(this.passwordForm, err, this.passwordOutcome);
      },
    });
  }

  protected signOutEverywhere(): void {
    this.session.signOutEverywhere().subscribe(() => void this.router.navigate(['/sign-in']));
  }

  protected deleteAccount(): void {
    if (this.deleteForm.invalid) {
      this.deleteForm.markAllAsTouched();
      return;
    }
    this.deleteFailure.set(null);
    this.session.deleteAccount(this.deleteForm.getRawValue().password).subscribe({
      next: ({ deletedWorkspaceNames }) =>
        void this.router.navigate(['/sign-in'], {
          state: { notice: deletedAccountNotice(deletedWorkspaceNames ?? []) },
        }),
      error: (err: unknown) => {
        const error = apiErrorOf(err);
        const rest = applyFieldErrors(this.deleteForm, error);
        this.deleteFailure.set(
          error.fields?.length && rest.length === 0 ? null : [error.message, ...rest].join(' '),
        );
      },
    });
  }

  private fail(form: FormGroup, err: unknown, outcome: ReturnType<typeof signal<Outcome>>): void {
    const error = apiErrorOf(err);
    const rest = applyFieldErrors(form, error);
    if (!error.fields?.length || rest.length)
      outcome.set({ ok: false, message: [error.message, ...rest].join(' ') });
  }
}
