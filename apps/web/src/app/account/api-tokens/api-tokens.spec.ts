import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { ApiToken } from '@gapwise/contracts';
import { ApiTokens } from './api-tokens';

const token = (over: Partial<ApiToken> = {}): ApiToken => ({
  id: 't1',
  name: 'nightly import',
  prefix: 'gw_abcdefg',
  createdAt: '2026-11-01T10:00:00.000Z',
  lastUsedAt: null,
  revokedAt: null,
  scope: 'read',
  expiresAt: null,
  ...over,
});

function setup() {
  TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
  const fixture = TestBed.createComponent(ApiTokens);
  fixture.detectChanges();
  const http = TestBed.inject(HttpTestingController);
  const el = fixture.nativeElement as HTMLElement;
  return { fixture, http, el };
}

describe('ApiTokens', () => {
  it('creates a read-only token expiring in 90 days by default and shows the secret once', () => {
    const { fixture, http, el } = setup();
    http.expectOne('/api/tokens').flush([]);
    fixture.detectChanges();
    expect(el.textContent).toContain('No API tokens yet.');
    const name = el.querySelector<HTMLInputElement>('input[formcontrolname="name"]')!;
    name.value = 'nightly import';
    name.dispatchEvent(new Event('input'));
    el.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    const req = http.expectOne({ method: 'POST', url: '/api/tokens' });
    expect(req.request.body.name).toBe('nightly import');
    expect(req.request.body.scope).toBe('read');
    const days = (new Date(req.request.body.expiresAt).getTime() - Date.now()) / 86_400_000;
    expect(days).toBeGreaterThan(89.9);
    expect(days).toBeLessThan(90.1);
    req.flush(
      { ...token(), token: 'gw_secret_value_shown_once' },
      { status: 201, statusText: 'Created' },
    );
    http.expectOne('/api/tokens').flush([token()]);
    fixture.detectChanges();
    expect(el.querySelector('[data-testid="new-token"]')!.textContent).toBe(
      'gw_secret_value_shown_once',
    );
    expect(el.querySelector('.token-list')!.textContent).toContain('Read only');
    expect(el.querySelector('.token-list')!.textContent).not.toContain(
      'gw_secret_value_shown_once',
    );
    http.verify();
  });

  it('revokes a token and marks revoked and expired ones', () => {
    const { fixture, http, el } = setup();
    http
      .expectOne('/api/tokens')
      .flush([
        token(),
        token({ id: 't2', name: 'old', revokedAt: '2026-11-02T10:00:00.000Z' }),
        token({ id: 't3', name: 'stale', expiresAt: '2020-01-01T00:00:00.000Z' }),
      ]);
    fixture.detectChanges();
    const items = el.querySelectorAll('.token-list li');
    expect(items[1]!.classList).toContain('ended');
    expect(items[1]!.textContent).toContain('revoked 2026-11-02');
    expect(items[2]!.textContent).toContain('expired 2020-01-01');
    el.querySelector<HTMLButtonElement>(
      'button[aria-label="Revoke token nightly import"]',
    )!.click();
    http.expectOne({ method: 'DELETE', url: '/api/tokens/t1' }).flush(null, {
      status: 204,
      statusText: 'No Content',
    });
    http.expectOne('/api/tokens').flush([]);
    http.verify();
  });

  it('shows a refused name under the field with its label', () => {
    const { fixture, http, el } = setup();
    http.expectOne('/api/tokens').flush([]);
    const name = el.querySelector<HTMLInputElement>('input[formcontrolname="name"]')!;
    name.value = 'x';
    name.dispatchEvent(new Event('input'));
    el.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    http.expectOne({ method: 'POST', url: '/api/tokens' }).flush(
      {
        error: {
          code: 'validation-failed',
          message: 'Some fields are not valid.',
          fields: [{ field: 'name', message: 'must be shorter than or equal to 100 characters' }],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    fixture.detectChanges();
    expect(el.querySelector('mat-error')!.textContent).toContain(
      'Token name must be shorter than or equal to 100 characters.',
    );
  });
});
