import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { Screen } from '@gapwise/contracts';
import { badRowReportOf } from './new-screen/bad-row-report';
import { ScreensApi, resultParams } from './screens-api';
import { intersectRanges } from './screen-results-store';

const screen = (status: Screen['status'], rowsDone: number): Screen =>
  ({
    id: 's1',
    status,
    progress: {
      rowsDone,
      rowCount: 4000,
      chunksDone: 0,
      chunkCount: 2,
      rowsPerSecond: null,
      etaSeconds: null,
    },
  }) as unknown as Screen;

describe('screens API client', () => {
  it('writes filters as the query the API reads (ranges, regimes, warnings, text)', () => {
    const p = resultParams({
      sort: '-score',
      offset: 50,
      limit: 25,
      ranges: { deltaGCs: { min: -1.2, max: null }, coupling: { max: 0.01 } },
      regimeCr: 'inverted',
      warnings: ['coupling-large', 'low-frequency-mode'],
      noWarnings: false,
      q: '  Med-4 ',
    });
    expect(p.toString()).toBe(
      'sort=-score&offset=50&limit=25&deltaGCsMin=-1.2&couplingMax=0.01&regimeCr=inverted' +
        '&warning=coupling-large,low-frequency-mode&q=Med-4',
    );
    expect(
      resultParams({ sort: 'donor', offset: 0, limit: 10, ranges: {} }, false).toString(),
    ).toBe('sort=donor');
  });

  it('intersects the form ranges with the brushed box (tighter bound wins)', () => {
    expect(
      intersectRanges(
        { deltaGCs: { min: -2, max: -0.1 } },
        { deltaGCs: { min: -1, max: 0.5 }, score: { min: 1 } },
      ),
    ).toEqual({ deltaGCs: { min: -1, max: -0.1 }, score: { min: 1, max: undefined } });
  });

  it('polls a running screen until it has finished, then stops', async () => {
    vi.useFakeTimers();
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    const api = TestBed.inject(ScreensApi);
    const http = TestBed.inject(HttpTestingController);
    const seen: number[] = [];
    let completed = false;
    api.watch('s1', 1000).subscribe({
      next: (s) => seen.push(s.progress.rowsDone),
      complete: () => (completed = true),
    });
    await vi.advanceTimersByTimeAsync(0);
    http.expectOne('/api/screens/s1').flush(screen('running', 0));
    await vi.advanceTimersByTimeAsync(1000);
    http.expectOne('/api/screens/s1').flush(screen('running', 2000));
    await vi.advanceTimersByTimeAsync(1000);
    http.expectOne('/api/screens/s1').flush(screen('done', 4000));
    await vi.advanceTimersByTimeAsync(3000);
    http.expectNone('/api/screens/s1');
    expect(seen).toEqual([0, 2000, 4000]);
    expect(completed).toBe(true);
    vi.useRealTimers();
  });

  it('reads a bad-row refusal into line numbers and counts', () => {
    const report = badRowReportOf({
      code: 'screen-bad-rows',
      message: '2 bad row(s): fix them, or run the 8 good row(s).',
      fields: [
        { field: 'line 3', message: "Line 3: 'distance': 'x' is not a number" },
        { field: 'line 9', message: 'Line 9: Temperature must be > 0 K' },
      ],
      current: { badRowCount: 2, goodRows: 8, fatal: false },
    });
    expect(report?.rows.map((r) => r.line)).toEqual([3, 9]);
    expect(report?.goodRows).toBe(8);
    expect(report?.rows[0].message).toBe("'distance': 'x' is not a number"); // line shown once
    expect(badRowReportOf({ code: 'validation-failed', message: 'x' })).toBeNull();
  });
});
