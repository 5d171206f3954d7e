import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { Type } from '@angular/core';
import { Router, provideRouter } from '@angular/router';
import { Session } from '../session';
import { ForgotPassword } from '../forgot-password/forgot-password';
import { ResetPassword } from './reset-password';

function setup<T>(component: Type<T>, token?: string) {
  TestBed.configureTestingModule({
    providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
  });
  const fixture = TestBed.createComponent(component);
  if (token) fixture.componentRef.setInput('token', token);
  fixture.detectChanges();
  const el = fixture.nativeElement as HTMLElement;
  const type = (selector: string, value: string) => {
    const input = el.querySelector<HTMLInputElement>(selector)!;
    input.value = value;
    input.dispatchEvent(new Event('input'));
  };
  return { fixture, el, type, http: TestBed.inject(HttpTestingController) };
}

describe('ResetPassword', () => {
  it('sends the token and the new password, signs in and opens the app', () => {
    const { el, type, http } = setup(ResetPassword, 'tok_ABCDEFGHIJKLMNOPQRSTU');
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
    type('input[formcontrolname="newPassword"]', 'a brand new phrase');
    el.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    const req = http.expectOne('/api/auth/password-reset/confirm');
    expect(req.request.body).toEqual({
      token: 'tok_ABCDEFGHIJKLMNOPQRSTU',
      newPassword: 'a brand new phrase',
    });
    req.flush({
      user: { id: 'u1', email: 'a@lab.example', displayName: 'A' },
      memberships: [],
      csrfToken: 'c',
    });
    expect(TestBed.inject(Session).user()!.id).toBe('u1');
    expect(navigate).toHaveBeenCalledWith('/');
  });

  it('offers a new link when the link is used or expired', () => {
    const { fixture, el, type, http } = setup(ResetPassword, 'tok_ABCDEFGHIJKLMNOPQRSTU');
    type('input[formcontrolname="newPassword"]', 'a brand new phrase');
    el.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    http.expectOne('/api/auth/password-reset/confirm').flush(
      {
        error: {
          code: 'reset-invalid',
          message: 'This password link is invalid, expired or already used.',
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    fixture.detectChanges();
    expect(el.querySelector('[role="alert"]')!.textContent).toContain('already used');
    expect(el.querySelector('a[href="/forgot-password"]')).not.toBeNull();
  });
});

describe('ForgotPassword', () => {
  it('asks for a link and says to check the mailbox without saying whether the account exists', () => {
    const { fixture, el, type, http } = setup(ForgotPassword);
    type('input[formcontrolname="email"]', 'ada@lab.example');
    el.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    const req = http.expectOne('/api/auth/password-reset');
    expect(req.request.body).toEqual({ email: 'ada@lab.example' });
    req.flush(
      {
        status: 'confirmation-sent',
        message: 'If this address has an account, a link to choose a new password is on its way.',
      },
      { status: 202, statusText: 'Accepted' },
    );
    fixture.detectChanges();
    expect(el.querySelector('h1')!.textContent).toContain('Check your e-mail');
    expect(el.textContent).toContain('If ada@lab.example has a Gapwise account');
  });
});
