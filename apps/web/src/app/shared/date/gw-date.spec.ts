import { describe, expect, it } from 'vitest';
import { GwDatePipe } from './gw-date';

describe('the one date format', () => {
  const pipe = new GwDatePipe();
  it('prints date and time in UTC with the zone named, or the day alone', () => {
    expect(pipe.transform('2026-12-02T14:05:59.000Z')).toBe('2026-12-02 14:05 UTC');
    expect(pipe.transform('2026-12-02T23:30:00-02:00')).toBe('2026-12-03 01:30 UTC');
    expect(pipe.transform('2026-12-02T14:05:00Z', 'day')).toBe('2026-12-02');
  });
  it('shows a dash for no date and leaves unreadable text as it is', () => {
    expect(pipe.transform(null)).toBe('—');
    expect(pipe.transform('yesterday', 'day')).toBe('yesterday');
  });
});
