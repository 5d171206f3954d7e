import { GwDatePipe } from '../../shared/date/gw-date';
import { ChangeDetectionStrategy, Component, OnInit, inject, signal } from '@angular/core';
import {
  FormControl,
  FormGroup,
  FormGroupDirective,
  ReactiveFormsModule,
  Validators,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { ApiToken, ApiTokenScope, CreatedApiToken } from '@gapwise/contracts';
import { apiErrorOf, applyFieldErrors } from '../../session/api-errors';
import { TokensApi } from '../tokens-api';

/** Lifetimes offered for a new token; `null` = until revoked. */
export const TOKEN_LIFETIMES: ReadonlyArray<{ days: number | null; label: string }> = [
  { days: 30, label: '30 days' },
  { days: 90, label: '90 days' },
  { days: 365, label: '1 year' },
  { days: null, label: 'No expiry (until revoked)' },
];

export const SCOPE_WORDS: Record<ApiTokenScope, string> = {
  read: 'Read only',
  'read-write': 'Read and write',
};

/** Create (shown once), list and revoke personal API tokens. */
@Component({
  selector: 'gw-api-tokens',
  imports: [
    GwDatePipe,
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
  ],
  templateUrl: './api-tokens.html',
  styleUrl: '../account-page/account-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ApiTokens implements OnInit {
  private readonly api = inject(TokensApi);

  protected readonly lifetimes = TOKEN_LIFETIMES;
  protected readonly scopeWords = SCOPE_WORDS;
  protected readonly tokens = signal<ApiToken[]>([]);
  protected readonly created = signal<CreatedApiToken | null>(null);
  protected readonly failure = signal<string | null>(null);
  protected readonly busy = signal(false);
  protected readonly copied = signal(false);
  protected readonly form = new FormGroup({
    name: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    scope: new FormControl<ApiTokenScope>('read', { nonNullable: true }),
    lifetimeDays: new FormControl<number | null>(90),
  });

  ngOnInit(): void {
    this.load();
  }

  protected live(t: ApiToken): boolean {
    return !t.revokedAt && (!t.expiresAt || new Date(t.expiresAt).getTime() > Date.now());
  }

  protected create(directive: FormGroupDirective): void {
    if (this.form.invalid || !this.form.controls.name.value.trim()) {
      this.form.controls.name.setErrors({ required: true });
      this.form.markAllAsTouched();
      return;
    }
    const { name, scope, lifetimeDays } = this.form.getRawValue();
    const expiresAt =
      lifetimeDays === null ? null : new Date(Date.now() + lifetimeDays * 86_400_000).toISOString();
    this.busy.set(true);
    this.failure.set(null);
    this.api.create({ name: name.trim(), scope, expiresAt }).subscribe({
      next: (token) => {
        this.busy.set(false);
        this.copied.set(false);
        this.created.set(token);
        // Reset through the directive too, so the emptied name shows no "required" error.
        directive.resetForm({ ...this.form.getRawValue(), name: '' });
        this.load();
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

  protected copy(token: string): void {
    void navigator.clipboard?.writeText(token).then(() => this.copied.set(true));
  }

  protected revoke(t: ApiToken): void {
    this.api.revoke(t.id).subscribe(() => {
      if (this.created()?.id === t.id) this.created.set(null);
      this.load();
    });
  }

  private load(): void {
    this.api.list().subscribe((list) => this.tokens.set(list));
  }
}
