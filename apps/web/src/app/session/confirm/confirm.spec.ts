import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { Session } from '../session';
import { Confirm } from './confirm';

@Component({ template: 'landed' })
class Landing {}

const INFO = {
  user: { id: 'u1', email: 'ada@lab.example', displayName: 'Ada' },
  memberships: [],
  csrfToken: 'csrf-token-value-0000000000',
};

function setup(returnUrl?: string) {
  TestBed.configureTestingModule({
    providers: [
      provideRouter([{ path: '**', component: Landing }]),
      provideHttpClient(),
      provideHttpClientTesting(),
    ],
  });
  const fixture = TestBed.createComponent(Confirm);
  fixture.componentRef.setInput('token', 'tok_ABC-123');
  if (returnUrl !== undefined) fixture.componentRef.setInput('returnUrl', returnUrl);
  fixture.detectChanges();
  return {
    fixture,
    el: fixture.nativeElement as HTMLElement,
    http: TestBed.inject(HttpTestingController),
    session: TestBed.inject(Session),
    router: TestBed.inject(Router),
  };
}

describe('Confirm', () => {
  it('confirms the token, signs in and opens the page the registration came from', async () => {
    const { http, session, router } = setup('/invitations/inv_1');
    const navigate = vi.spyOn(router, 'navigateByUrl');
    const req = http.expectOne('/api/auth/confirm');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({ token: 'tok_ABC-123' });
    req.flush(INFO);
    expect(session.user()?.email).toBe('ada@lab.example');
    expect(navigate).toHaveBeenCalledWith('/invitations/inv_1');
  });

  it('goes to the app when there is no (safe) return URL', () => {
    const { http, router } = setup('https://elsewhere.example/x');
    const navigate = vi.spyOn(router, 'navigateByUrl');
    http.expectOne('/api/auth/confirm').flush(INFO);
    expect(navigate).toHaveBeenCalledWith('/');
  });

  it('explains an invalid, used or expired link and offers to register again or sign in', () => {
    const { fixture, el, http, session } = setup();
    http.expectOne('/api/auth/confirm').flush(
      {
        error: {
          code: 'confirmation-invalid',
          message: 'This confirmation link is invalid, expired or already used.',
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    fixture.detectChanges();
    expect(el.querySelector('[role="alert"]')!.textContent).toContain(
      'invalid, expired or already used',
    );
    const links = Array.from(el.querySelectorAll('a'), (a) => a.getAttribute('href'));
    expect(links).toEqual(['/register', '/sign-in']);
    expect(session.user()).toBeNull();
  });
});
