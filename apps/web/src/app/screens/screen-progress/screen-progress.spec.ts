import { TestBed } from '@angular/core/testing';
import type { Screen } from '@gapwise/contracts';
import { ScreenProgress, formatEta } from './screen-progress';

describe('ScreenProgress', () => {
  it('formats the time left', () => {
    expect(formatEta(0.4)).toBe('under 1 s');
    expect(formatEta(42)).toBe('42 s');
    expect(formatEta(75)).toBe('1 min 15 s');
    expect(formatEta(3725)).toBe('1 h 2 min');
    expect(formatEta(null)).toBe('—');
  });

  it('shows rows done, rows per second and time left while running', () => {
    const fixture = TestBed.createComponent(ScreenProgress);
    fixture.componentRef.setInput('screen', {
      status: 'running',
      progress: {
        rowsDone: 4000,
        rowCount: 10000,
        chunksDone: 2,
        chunkCount: 5,
        rowsPerSecond: 5234.4,
        etaSeconds: 1.2,
      },
    } as unknown as Screen);
    fixture.detectChanges();
    const text = fixture.nativeElement.textContent as string;
    expect(text).toContain('4,000 of 10,000 rows computed (40 %)');
    expect(text).toContain('5,234 rows/s');
    expect(text).toContain('about 1 s left');
    expect(text).toContain('2 of 5 chunks');
  });
});
