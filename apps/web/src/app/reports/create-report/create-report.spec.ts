import { TestBed } from '@angular/core/testing';
import { ActivatedRoute, Router, convertToParamMap, provideRouter } from '@angular/router';
import { of } from 'rxjs';
import { CascadesApi } from '../../cascades/cascades-api';
import { PairsApi } from '../../pairs/pairs-api';
import { ReportsApi } from '../reports-api';
import { CreateReport } from './create-report';

const CASCADE_ID = '00000000-0000-4000-8000-00000000c001';

function setup(query: Record<string, string>) {
  const calls: string[] = [];
  const api = {
    create: (wid: string, ids: string[]) => {
      calls.push(`pair ${ids.join(',')}`);
      return of({ reportId: 'r1' });
    },
    createForCascade: (wid: string, id: string) => {
      calls.push(`cascade ${id}`);
      return of({ reportId: 'r2' });
    },
  };
  TestBed.configureTestingModule({
    providers: [
      provideRouter([]),
      { provide: ReportsApi, useValue: api },
      {
        provide: CascadesApi,
        useValue: { list: () => of([{ id: CASCADE_ID, name: 'Demo triad', version: 2 }]) },
      },
      {
        provide: PairsApi,
        useValue: { list: () => of({ items: [{ id: 'p1', name: 'DA-1' }], total: 1 }) },
      },
      {
        provide: ActivatedRoute,
        useValue: {
          snapshot: {
            paramMap: convertToParamMap({ wid: 'w1' }),
            queryParamMap: convertToParamMap(query),
          },
        },
      },
    ],
  });
  const router = TestBed.inject(Router);
  const navigated: unknown[] = [];
  router.navigate = ((commands: unknown[]) => {
    navigated.push(commands);
    return Promise.resolve(true);
  }) as Router['navigate'];
  const fixture = TestBed.createComponent(CreateReport);
  fixture.detectChanges();
  return { fixture, el: fixture.nativeElement as HTMLElement, calls, navigated };
}

describe('CreateReport', () => {
  it('creates a pair report at once when the address names the pair', () => {
    const { calls, navigated, el } = setup({ pairId: 'p1' });
    expect(calls).toEqual(['pair p1']);
    expect(navigated).toEqual([['/w', 'w1', 'reports', 'r1']]);
    expect(el.querySelector('form')).toBeNull();
  });

  it('preselects the cascade of the address and creates a cascade report on submit', async () => {
    const { fixture, el, calls, navigated } = setup({ cascadeId: CASCADE_ID });
    await fixture.whenStable();
    fixture.detectChanges();
    expect(calls).toEqual([]);
    expect(el.querySelector('mat-select')?.textContent).toContain('Demo triad (v2)');
    const button = Array.from(el.querySelectorAll('button')).find(
      (b) => b.textContent?.trim() === 'Create report',
    )!;
    expect(button.disabled).toBe(false);
    button.click();
    expect(calls).toEqual([`cascade ${CASCADE_ID}`]);
    expect(navigated).toEqual([['/w', 'w1', 'reports', 'r2']]);
  });

  it('asks for a subject when none is given', () => {
    const { el, calls } = setup({});
    expect(calls).toEqual([]);
    const button = Array.from(el.querySelectorAll('button')).find(
      (b) => b.textContent?.trim() === 'Create report',
    )!;
    expect(button.disabled).toBe(true);
  });
});
