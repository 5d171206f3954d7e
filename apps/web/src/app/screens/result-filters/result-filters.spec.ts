import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { OverlayContainer } from '@angular/cdk/overlay';
import { TestBed } from '@angular/core/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { ResultFilters } from './result-filters';

const subs = (el: Element) => Array.from(el.querySelectorAll('sub'), (s) => s.textContent);

describe('ResultFilters', () => {
  it('names quantities and warnings with subscripts in the options and the chosen value', async () => {
    const fixture = TestBed.createComponent(ResultFilters);
    fixture.detectChanges();
    const loader = TestbedHarnessEnvironment.documentRootLoader(fixture);
    const container = TestBed.inject(OverlayContainer).getContainerElement();

    const [quantity] = await loader.getAllHarnesses(MatSelectHarness);
    await quantity.open();
    const options = Array.from(container.querySelectorAll('mat-option'));
    const coupling = options.find((o) => o.textContent?.includes('|HAB| / meV'))!;
    expect(subs(coupling)).toEqual(['AB']);
    expect(options.map((o) => o.textContent).join(' ')).not.toContain('_');
    await quantity.clickOptions({ text: '|HAB| / meV' });
    const trigger = fixture.nativeElement.querySelector('.range mat-select') as HTMLElement;
    expect(trigger.textContent?.trim()).toBe('|HAB| / meV');
    expect(subs(trigger)).toEqual(['AB']);

    const warnings = await loader.getHarness(
      MatSelectHarness.with({ selector: '.warnings mat-select' }),
    );
    await warnings.open();
    await warnings.clickOptions({ text: /^2\|HAB\| ≥ λ/ });
    const chosen = fixture.nativeElement.querySelector('.warnings mat-select') as HTMLElement;
    expect(chosen.textContent).toContain('2|HAB| ≥ λ: delocalized, no diabatic rate');
    expect(chosen.textContent).not.toContain('_');
    expect(subs(chosen)).toEqual(['AB']);
  });
});
