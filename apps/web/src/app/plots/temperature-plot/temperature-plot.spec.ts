import { TestBed } from '@angular/core/testing';
import { TemperaturePlot, parseMeasuredRates } from './temperature-plot';

const KB = 8.617333262e-5;

async function render() {
  const fixture = TestBed.createComponent(TemperaturePlot);
  fixture.componentRef.setInput('request', {
    method: 'rate.marcus',
    inputs: { deltaG0: -0.3, lambda: 0.8, coupling: 0.01, temperature: 298.15 },
  });
  fixture.componentRef.setInput('temperature', 298.15);
  fixture.detectChanges();
  await fixture.whenStable();
  return fixture;
}

async function type(fixture: Awaited<ReturnType<typeof render>>, text: string) {
  const el = fixture.nativeElement as HTMLElement;
  const area = el.querySelector('textarea')!;
  area.value = text;
  area.dispatchEvent(new Event('input'));
  fixture.detectChanges();
  await fixture.whenStable();
  return el;
}

describe('TemperaturePlot with measured k(T)', () => {
  it('draws the measured points and the Arrhenius fit with E_a ± SE', async () => {
    const fixture = await render();
    // Exact Arrhenius data with E_a = 0.2 eV, A = 1e10 s⁻¹: the fit returns E_a = 0.200 eV.
    const lines = [260, 290, 320, 350].map(
      (t) => `${t} ${(1e10 * Math.exp(-0.2 / (KB * t))).toExponential(12)}`,
    );
    const el = await type(fixture, lines.join('\n'));
    expect(el.querySelectorAll('circle.measured')).toHaveLength(4);
    expect(el.querySelector('path.measured-fit')).not.toBeNull();
    expect(el.textContent).toContain('0.2 ±');
    expect(el.textContent).toContain('Eyring');
  });

  it('lists bad lines and the core refusal for fewer than 3 temperatures', async () => {
    const fixture = await render();
    const el = await type(fixture, '300 1e6\n310 abc\n320 2e6');
    const errors = Array.from(el.querySelectorAll('p.error'), (p) => p.textContent);
    expect(errors).toContain("Line 2: 'abc' is not a number.");
    expect(errors.some((e) => e?.includes('Need ≥ 3 distinct points'))).toBe(true);
    expect(el.querySelector('path.measured-fit')).toBeNull();
  });

  it('parses strictly: locale commas and extra columns are refused', () => {
    const { points, errors } = parseMeasuredRates('300 1,5e6\n300 1e6 3\n\n310 2e6');
    expect(points).toEqual([{ temperature: 310, k: 2e6 }]);
    expect(errors).toHaveLength(2);
  });
});
