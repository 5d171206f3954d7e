import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import type { SessionInfo } from '@gapwise/contracts';
import { Session } from '../../session/session';
import { AccountPage } from './account-page';

const INFO: SessionInfo = {
  user: { id: 'u1', email: 'ada@lab.example', displayName: 'Ada' },
  memberships: [],
  csrfToken: 'csrf',
};

function setup() {
  TestBed.configureTestingModule({
    providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
  });
  const session = TestBed.inject(Session);
  (session as unknown as { accept(i: SessionInfo): void }).accept(INFO);
  const fixture = TestBed.createComponent(AccountPage);
  fixture.detectChanges();
  const http = TestBed.inject(HttpTestingController);
  http.expectOne('/api/tokens').flush([]);
  fixture.detectChanges();
  const el = fixture.nativeElement as HTMLElement;
  const type = (selector: string, value: string) => {
    const input = el.querySelector<HTMLInputElement>(selector)!;
    input.value = value;
    input.dispatchEvent(new Event('input'));
  };
  const press = (text: string) =>
    [...el.querySelectorAll<HTMLButtonElement>('button')]
      .find((b) => b.textContent!.includes(text))!
      .click();
  return { fixture, http, el, type, press, session, router: TestBed.inject(Router) };
}

describe('AccountPage', () => {
  it('starts from the current name and saves a new one', () => {
    const { fixture, http, el, type, press, session } = setup();
    const name = el.querySelector<HTMLInputElement>('input[formcontrolname="displayName"]')!;
    expect(name.value).toBe('Ada');
    type('input[formcontrolname="displayName"]', 'Ada L.');
    press('Save name');
    const req = http.expectOne({ method: 'PATCH', url: '/api/auth/me' });
    expect(req.request.body).toEqual({ displayName: 'Ada L.' });
    req.flush({ ...INFO, user: { ...INFO.user, displayName: 'Ada L.' } });
    fixture.detectChanges();
    expect(session.user()!.displayName).toBe('Ada L.');
    expect(el.textContent).toContain('Name saved.');
  });

  it('changes the password, says how many other sessions ended, and puts a wrong current password under its field', () => {
    const { fixture, http, el, type, press } = setup();
    type('input[formcontrolname="currentPassword"]', 'not it at all');
    type('input[formcontrolname="newPassword"]', 'a new long phrase');
    press('Change password');
    http.expectOne({ method: 'POST', url: '/api/auth/password' }).flush(
      {
        error: {
          code: 'validation-failed',
          message: 'Some fields are not valid.',
          fields: [{ field: 'currentPassword', message: 'is not your current password' }],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    fixture.detectChanges();
    expect(el.textContent).toContain('Current password is not your current password.');

    type('input[formcontrolname="currentPassword"]', 'the right one!');
    press('Change password');
    const req = http.expectOne({ method: 'POST', url: '/api/auth/password' });
    expect(req.request.body).toEqual({
      currentPassword: 'the right one!',
      newPassword: 'a new long phrase',
    });
    req.flush({ endedSessions: 2 });
    fixture.detectChanges();
    expect(el.textContent).toContain('Password changed. 2 other sessions were signed out.');
  });

  it('refuses a new password over 72 bytes before sending', () => {
    const { fixture, http, el, type, press } = setup();
    type('input[formcontrolname="currentPassword"]', 'the right one!');
    type('input[formcontrolname="newPassword"]', 'é'.repeat(40));
    press('Change password');
    fixture.detectChanges();
    http.expectNone('/api/auth/password');
    expect(el.textContent).toContain('Too long: 80 bytes, at most 72');
  });

  it('signs out everywhere and opens sign-in', () => {
    const { http, press, router, session } = setup();
    const navigate = vi.spyOn(router, 'navigate').mockResolvedValue(true);
    press('Sign out everywhere');
    http.expectOne({ method: 'POST', url: '/api/auth/sign-out-everywhere' }).flush({
      endedSessions: 3,
    });
    expect(session.user()).toBeNull();
    expect(navigate).toHaveBeenCalledWith(['/sign-in']);
  });

  it('states the workspace rule and shows a sole-owner refusal', () => {
    const { fixture, http, el, type, press, session } = setup();
    expect(el.textContent).toContain('While you are the only owner of a workspace');
    type('input[formcontrolname="password"]', 'correct horse battery');
    press('Delete my account');
    const req = http.expectOne({ method: 'DELETE', url: '/api/auth/account' });
    expect(req.request.body).toEqual({ password: 'correct horse battery' });
    req.flush(
      {
        error: {
          code: 'sole-owner',
          message: 'You are the only owner of "Photoredox Lab", which other people use.',
        },
      },
      { status: 409, statusText: 'Conflict' },
    );
    fixture.detectChanges();
    expect(el.querySelector('[role="alert"]')!.textContent).toContain('"Photoredox Lab"');
    expect(session.user()).not.toBeNull();
  });
});
