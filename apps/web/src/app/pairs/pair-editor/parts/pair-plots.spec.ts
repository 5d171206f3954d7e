import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatTabGroupHarness } from '@angular/material/tabs/testing';
import { PairPlots } from './pair-plots';

const settle = () => new Promise((resolve) => setTimeout(resolve, 40));

describe('PairPlots', { timeout: 30_000 }, () => {
  it('draws the free-energy curves first and the other plots on their tabs', async () => {
    const fixture = TestBed.createComponent(PairPlots);
    fixture.componentRef.setInput('deltaG0', -0.3);
    fixture.componentRef.setInput('lambda', 0.8);
    fixture.componentRef.setInput('coupling', 0.005);
    fixture.componentRef.setInput('temperature', 298.15);
    fixture.componentRef.setInput('fileStem', 'd-a');
    fixture.componentRef.setInput('rateRequest', {
      method: 'rate.marcus',
      inputs: { deltaG0: -0.3, lambda: 0.8, coupling: 0.005, temperature: 298.15 },
    });
    const redrawn = vi.fn();
    fixture.componentInstance.redrawn.subscribe(redrawn);
    fixture.detectChanges();
    await settle();
    fixture.detectChanges();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('gw-parabola-plot path.curve.reactant')).not.toBeNull();
    expect(el.querySelector('gw-temperature-plot')).toBeNull();
    expect(redrawn).toHaveBeenCalled();

    const tabs = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatTabGroupHarness);
    expect(await Promise.all((await tabs.getTabs()).map((t) => t.getLabel()))).toEqual([
      'Free-energy curves',
      'Rate vs driving force',
      'Rate vs temperature',
    ]);
    await tabs.selectTab({ label: 'Rate vs temperature' });
    await settle();
    fixture.detectChanges();
    expect(el.querySelector('gw-temperature-plot')).not.toBeNull();
  });
});
