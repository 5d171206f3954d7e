import { auditParams } from './audit-api';
import { actionWords } from './audit-words';

describe('audit trail query', () => {
  it('sends a pair as entityType=pair&entityId and leaves empty filters out', () => {
    expect(
      auditParams({ actorId: 'u1', pairId: 'p1', from: '2026-12-01', to: '2026-12-05' }).toString(),
    ).toBe('actorId=u1&entityType=pair&entityId=p1&from=2026-12-01&to=2026-12-05');
    expect(auditParams({}).toString()).toBe('');
  });

  it('says what an action did in words, and falls back to its parts', () => {
    expect(actionWords('pair.updated')).toBe('changed a pair');
    expect(actionWords('report.approve')).toBe('approved a report');
    expect(actionWords('trace-analysis.re-fitted')).toBe('re fitted (trace analysis)');
  });
});
