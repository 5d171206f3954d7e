import type { PairListItem } from '@gapwise/contracts';
import { pairsToCsv } from './pair-csv';

describe('pairsToCsv', () => {
  it('neutralises formula text with the shared rule and keeps negative numbers numbers', () => {
    const row = {
      name: "-2+3+cmd|' /C calc'!A0",
      donor: '=HYPERLINK("x")',
      acceptor: '@A1',
      status: 'draft',
      deltaG0: -0.42,
      lambda: 0.8,
      coupling: null,
      log10k: 9.5,
      regime: 'normal',
      tags: ['+tag'],
      updatedAt: '2026-01-01T00:00:00.000Z',
      updatedBy: 'Ada',
    } as unknown as PairListItem;
    const line = pairsToCsv([row]).split('\r\n')[1];
    expect(line).toBe(
      `'-2+3+cmd|' /C calc'!A0,"'=HYPERLINK(""x"")",'@A1,draft,-0.42,0.8,,9.5,normal,,,,'+tag,2026-01-01T00:00:00.000Z,Ada`,
    );
  });
});
