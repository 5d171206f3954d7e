import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { Pair } from '@gapwise/contracts';
import { PairEditorHeader } from './pair-editor-header';

const PAIR = { id: 'p1', name: 'D-A 1', version: 7 } as Pair;

function render(inputs: Record<string, unknown>) {
  TestBed.configureTestingModule({ providers: [provideRouter([])] });
  const fixture = TestBed.createComponent(PairEditorHeader);
  fixture.componentRef.setInput('wid', 'w1');
  for (const [k, v] of Object.entries(inputs)) fixture.componentRef.setInput(k, v);
  fixture.detectChanges();
  return { fixture, el: fixture.nativeElement as HTMLElement };
}

describe('PairEditorHeader', () => {
  it('titles a new pair and offers only "Create pair"', () => {
    const { el } = render({ isNew: true });
    expect(el.querySelector('h1')?.textContent?.trim()).toBe('New pair');
    expect(el.querySelector('button.save')?.textContent).toMatch(/Create pair/);
    expect(el.textContent).not.toMatch(/Version history/);
    expect(el.querySelector('.unsaved')).toBeNull();
  });

  it('shows the name, version, links of a saved pair and emits save', () => {
    const { fixture, el } = render({ isNew: false, pair: PAIR, dirty: true });
    expect(el.querySelector('h1')?.textContent).toMatch(/D-A 1\s+v7/);
    expect(el.querySelector('.unsaved')?.textContent).toBe('Unsaved changes');
    const links = [...el.querySelectorAll('a')].map((a) => a.getAttribute('href'));
    expect(links).toEqual([
      '/w/w1/pairs',
      '/w/w1/pairs/p1/history',
      '/w/w1/pairs/p1/solvents',
      '/w/w1/reports?pairId=p1',
      '/w/w1/reports/new?pairId=p1',
    ]);
    const saved = vi.fn();
    fixture.componentInstance.save.subscribe(saved);
    const button = el.querySelector<HTMLButtonElement>('button.save')!;
    expect(button.textContent).toMatch(/Save/);
    button.click();
    expect(saved).toHaveBeenCalledTimes(1);
  });

  it('hides editing actions when read-only and disables save while saving', () => {
    const { el } = render({ isNew: false, pair: PAIR, dirty: true, readOnly: true });
    expect(el.querySelector('button.save')).toBeNull();
    expect(el.querySelector('.unsaved')).toBeNull();
    expect(el.textContent).not.toMatch(/Create report/);
    TestBed.resetTestingModule();
    const saving = render({ isNew: false, pair: PAIR, saving: true });
    expect(saving.el.querySelector<HTMLButtonElement>('button.save')!.disabled).toBe(true);
  });
});
