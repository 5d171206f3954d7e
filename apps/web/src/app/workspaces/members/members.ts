import { GwDatePipe } from '../../shared/date/gw-date';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { ROLES, canReadAudit, type Invitation, type Member, type Role } from '@gapwise/contracts';
import { catchError, combineLatest, of, switchMap } from 'rxjs';
import { apiErrorOf, applyFieldErrors } from '../../session/api-errors';
import { Session } from '../../session/session';
import { WorkspaceContext } from '../workspace-context';
import { MembersApi } from './members-api';

const ROLE_WORDS: Record<Role, string> = {
  owner: 'everything, including members and roles',
  editor: 'create and change pairs; draft reports',
  reviewer: 'read everything; comment and approve reports',
  viewer: 'read everything',
};

/** Members of the workspace; the owner invites, changes roles and removes, others read. */
@Component({
  selector: 'gw-members',
  imports: [
    GwDatePipe,
    ReactiveFormsModule,
    MatTableModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatButtonModule,
    MatIconModule,
    RouterLink,
  ],
  templateUrl: './members.html',
  styleUrl: './members.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Members {
  private readonly api = inject(MembersApi);
  private readonly snackBar = inject(MatSnackBar);
  protected readonly session = inject(Session);
  protected readonly workspace = inject(WorkspaceContext);

  readonly wid = input.required<string>();

  protected readonly roles = ROLES;
  protected readonly canReadAudit = computed(() => canReadAudit(this.workspace.role()));
  protected readonly roleWords = ROLE_WORDS;
  private readonly reloads = signal(0);
  protected readonly inviteForm = new FormGroup({
    email: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.email],
    }),
    role: new FormControl<Role>('editor', { nonNullable: true }),
  });
  protected readonly inviting = signal(false);

  private readonly data = toSignal(
    combineLatest([toObservable(this.wid), toObservable(this.reloads)]).pipe(
      switchMap(([wid]) =>
        combineLatest([
          this.api.members(wid).pipe(catchError(() => of<Member[]>([]))),
          this.workspace.canManageMembers()
            ? this.api.invitations(wid).pipe(catchError(() => of<Invitation[]>([])))
            : of<Invitation[]>([]),
        ]),
      ),
    ),
  );
  protected readonly members = computed(() => this.data()?.[0] ?? []);
  protected readonly invitations = computed(() =>
    (this.data()?.[1] ?? []).filter((i) => i.status === 'pending'),
  );
  protected readonly memberColumns = computed(() =>
    this.workspace.canManageMembers()
      ? ['name', 'email', 'role', 'actions']
      : ['name', 'email', 'role'],
  );

  protected roleMeaning(role: Role): string {
    return ROLE_WORDS[role] ?? '';
  }

  protected invite(): void {
    if (this.inviteForm.invalid) {
      this.inviteForm.markAllAsTouched();
      return;
    }
    const { email, role } = this.inviteForm.getRawValue();
    this.inviting.set(true);
    this.api.invite(this.wid(), email.trim(), role).subscribe({
      next: () => {
        this.inviting.set(false);
        this.snackBar.open(`Invitation e-mailed to ${email}.`, 'OK');
        this.inviteForm.reset({ email: '', role: 'editor' });
        this.reloads.update((n) => n + 1);
      },
      error: (err: unknown) => {
        this.inviting.set(false);
        const error = apiErrorOf(err);
        const rest = applyFieldErrors(this.inviteForm, error);
        if (!error.fields?.length || rest.length) this.snackBar.open(error.message, 'Dismiss');
      },
    });
  }

  protected changeRole(member: Member, role: Role): void {
    this.api.changeRole(this.wid(), member.userId, role).subscribe({
      next: () => {
        this.snackBar.open(`${member.displayName} is now ${role}.`, 'OK');
        this.reloads.update((n) => n + 1);
      },
      error: () => this.reloads.update((n) => n + 1),
    });
  }

  protected remove(member: Member): void {
    if (!confirm(`Remove ${member.displayName} (${member.email}) from this workspace?`)) return;
    this.api.remove(this.wid(), member.userId).subscribe(() => this.reloads.update((n) => n + 1));
  }

  protected revoke(invitation: Invitation): void {
    this.api.revoke(this.wid(), invitation.id).subscribe(() => this.reloads.update((n) => n + 1));
  }
}
