import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import { NewScreen } from './new-screen';

describe('NewScreen', () => {
  it('shows bad rows by line number and re-sends the good rows when the user chooses so', async () => {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    const fixture = TestBed.createComponent(NewScreen);
    const http = TestBed.inject(HttpTestingController);
    fixture.detectChanges();
    http.expectOne('/api/screens/options').flush({ solvents: [], scores: {}, warnings: [] });
    const el: HTMLElement = fixture.nativeElement;

    // Paste mode, a name and the rows.
    const component = fixture.componentInstance as unknown as {
      form: { patchValue(v: object): void };
    };
    component.form.patchValue({
      name: 'Mediators A',
      source: 'paste',
      paste: 'donor,acceptor\nMed-1,Med-2',
    });
    fixture.detectChanges();
    el.querySelector<HTMLButtonElement>('button.send')!.click();
    const first = http.expectOne((r) => r.url.endsWith('/screens'));
    expect(first.request.params.get('runGoodRows')).toBeNull();
    expect(first.request.body).toEqual({ csv: 'donor,acceptor\nMed-1,Med-2' });
    first.flush(
      {
        error: {
          code: 'screen-bad-rows',
          message: '1 bad row(s)',
          fields: [{ field: 'line 7', message: "Line 7: 'epsilon': 'n/a' is not a number" }],
          current: { badRowCount: 1, goodRows: 41, fatal: false },
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    fixture.detectChanges();
    expect(el.querySelector('.report h2')?.textContent).toContain('1 bad row(s), 41 good row(s)');
    expect(el.querySelector('.bad-rows')?.textContent).toContain('Line 7');
    expect(el.querySelector('.choose-fix')).not.toBeNull();

    el.querySelector<HTMLButtonElement>('.choose-run-good')!.click();
    const second = http.expectOne((r) => r.url.endsWith('/screens'));
    expect(second.request.params.get('runGoodRows')).toBe('true');
    expect(second.request.params.get('name')).toBe('Mediators A');
    second.flush({ id: 'new-screen-id' });
    expect(navigate).toHaveBeenCalledWith(['/w', '', 'screens', 'new-screen-id']);
    http.verify();
  });

  it('records "fix the file": the next upload says so', () => {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    const fixture = TestBed.createComponent(NewScreen);
    const http = TestBed.inject(HttpTestingController);
    fixture.detectChanges();
    http.expectOne('/api/screens/options').flush({ solvents: [], scores: {}, warnings: [] });
    const el: HTMLElement = fixture.nativeElement;
    const component = fixture.componentInstance as unknown as {
      form: { patchValue(v: object): void };
    };
    component.form.patchValue({ name: 'B', source: 'paste', paste: 'x' });
    fixture.detectChanges();
    el.querySelector<HTMLButtonElement>('button.send')!.click();
    http
      .expectOne((r) => r.url.endsWith('/screens'))
      .flush(
        {
          error: {
            code: 'screen-bad-rows',
            message: 'bad',
            fields: [{ field: 'line 2', message: 'm' }],
            current: { badRowCount: 1, goodRows: 0, fatal: false },
          },
        },
        { status: 400, statusText: 'Bad Request' },
      );
    fixture.detectChanges();
    // No good rows: only "fix the file" is offered.
    expect(el.querySelector('.choose-run-good')).toBeNull();
    el.querySelector<HTMLButtonElement>('.choose-fix')!.click();
    fixture.detectChanges();
    expect(el.querySelector('.fixing')?.textContent).toContain('corrected file');
    component.form.patchValue({ paste: 'fixed rows' });
    fixture.detectChanges();
    el.querySelector<HTMLButtonElement>('button.send')!.click();
    const again = http.expectOne((r) => r.url.endsWith('/screens'));
    expect(again.request.params.get('badRowChoice')).toBe('fixed');
  });
});
