import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { Session } from '../session';
import { Register } from './register';

const ANSWER = {
  status: 'confirmation-sent',
  message: 'If this address can be registered, a confirmation link is on its way.',
};

function setup(returnUrl?: string) {
  TestBed.configureTestingModule({
    providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
  });
  const fixture = TestBed.createComponent(Register);
  if (returnUrl !== undefined) fixture.componentRef.setInput('returnUrl', returnUrl);
  fixture.detectChanges();
  const el = fixture.nativeElement as HTMLElement;
  const type = (selector: string, value: string) => {
    const input = el.querySelector<HTMLInputElement>(selector)!;
    input.value = value;
    input.dispatchEvent(new Event('input'));
  };
  const submit = () => {
    type('input[formcontrolname="displayName"]', 'Ada Lovelace');
    type('input[formcontrolname="email"]', 'ada@lab.example');
    type('input[formcontrolname="password"]', 'a long enough pass');
    el.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    fixture.detectChanges();
  };
  return {
    fixture,
    el,
    submit,
    http: TestBed.inject(HttpTestingController),
    session: TestBed.inject(Session),
  };
}

describe('Register', () => {
  it('after submitting, says to check the e-mail and signs nobody in', () => {
    const { fixture, el, submit, http, session } = setup('/invitations/tok_ABC-123');
    submit();
    const req = http.expectOne('/api/auth/register');
    expect(req.request.body).toEqual({
      displayName: 'Ada Lovelace',
      email: 'ada@lab.example',
      password: 'a long enough pass',
      returnUrl: '/invitations/tok_ABC-123',
    });
    req.flush(ANSWER, { status: 202, statusText: 'Accepted' });
    fixture.detectChanges();
    expect(el.querySelector('h1')!.textContent).toContain('Check your e-mail');
    expect(el.textContent).toContain(ANSWER.message);
    expect(el.textContent).toContain('ada@lab.example');
    expect(el.querySelector('form')).toBeNull();
    expect(session.user()).toBeNull();
    http.verify();
  });

  it('does not send a return URL the confirmation link cannot carry', () => {
    const { submit, http } = setup('/w/1/pairs?sort=name');
    submit();
    const req = http.expectOne('/api/auth/register');
    expect('returnUrl' in req.request.body).toBe(false);
    req.flush(ANSWER, { status: 202, statusText: 'Accepted' });
  });

  it('shows field errors of a 400 and keeps the form', () => {
    const { fixture, el, submit, http } = setup();
    submit();
    http.expectOne('/api/auth/register').flush(
      {
        error: {
          code: 'validation-failed',
          message: 'Some fields are not valid.',
          fields: [{ field: 'password', message: 'must use at least 4 different characters' }],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    fixture.detectChanges();
    expect(el.querySelector('form')).not.toBeNull();
    expect(el.textContent).not.toContain('Check your e-mail');
  });
});
