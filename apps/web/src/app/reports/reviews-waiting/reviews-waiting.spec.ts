import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { of } from 'rxjs';
import type { ReportListItem } from '@gapwise/contracts';
import { ReportsApi } from '../reports-api';
import { ReviewsWaiting } from './reviews-waiting';

const ITEM: ReportListItem = {
  id: '00000000-0000-4000-8000-000000000007',
  workspaceId: '00000000-0000-4000-8000-000000000001',
  workspaceName: 'Halden Photoredox Lab',
  kind: 'pair',
  title: 'DA-3 photoinduced charge separation: rate estimate for review',
  status: 'submitted',
  author: { id: '00000000-0000-4000-8000-0000000000e1', displayName: 'Emil Sandoval' },
  pairIds: ['00000000-0000-4000-8000-0000000000f3'],
  snapshotId: 'e'.repeat(64),
  createdAt: '2026-12-02T02:40:00.000Z',
  updatedAt: '2026-12-02T02:41:00.000Z',
};

function render(rows: ReportListItem[]): HTMLElement {
  TestBed.configureTestingModule({
    providers: [provideRouter([]), { provide: ReportsApi, useValue: { waiting: () => of(rows) } }],
  });
  const fixture = TestBed.createComponent(ReviewsWaiting);
  fixture.detectChanges();
  return fixture.nativeElement as HTMLElement;
}

describe('ReviewsWaiting', () => {
  it('links each waiting report into its workspace, with its author and last change', () => {
    const el = render([ITEM]);
    const link = el.querySelector('tbody a')!;
    expect(link.getAttribute('href')).toBe(`/w/${ITEM.workspaceId}/reports/${ITEM.id}`);
    expect(link.textContent).toContain('DA-3 photoinduced');
    const headers = Array.from(el.querySelectorAll('thead th'), (th) => th.textContent?.trim());
    expect(headers).toEqual(['Report', 'Workspace', 'Author', 'Last change']);
    expect(el.querySelector('tbody tr')!.textContent).toContain('2026-12-02 02:41 UTC');
  });

  it('says so when nothing waits', () => {
    expect(render([]).textContent).toContain('Nothing is waiting for your review.');
  });
});
