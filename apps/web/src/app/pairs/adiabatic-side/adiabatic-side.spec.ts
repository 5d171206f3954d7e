import { TestBed } from '@angular/core/testing';
import { AdiabaticSide } from './adiabatic-side';

function render(regime: string | null, coupling: number, deltaG0 = -0.3, lambda = 0.8) {
  TestBed.configureTestingModule({ imports: [AdiabaticSide] });
  const fixture = TestBed.createComponent(AdiabaticSide);
  fixture.componentRef.setInput('regime', regime);
  fixture.componentRef.setInput('deltaG0', deltaG0);
  fixture.componentRef.setInput('lambda', lambda);
  fixture.componentRef.setInput('coupling', coupling);
  fixture.componentRef.setInput('temperature', 298.15);
  fixture.detectChanges();
  return fixture.nativeElement as HTMLElement;
}

const text = (el: HTMLElement, sel: string) =>
  el.querySelector(sel)?.textContent?.replace(/\s+/g, ' ').trim();

describe('AdiabaticSide', () => {
  it('stays away for nonadiabatic pairs', () => {
    expect(render('nonadiabatic', 0.001).querySelector('.adiabatic')).toBeNull();
  });

  it('shows the Landau–Zener κ_el and the exact adiabatic barrier beside the rate', () => {
    // λ = 0.8, ΔG° = −0.3, H = 0.05 eV (SCIENCE.md §3 example). Independently:
    // γ = π^(3/2)H²/(hν_n(λk_BT)^½) with h = 4.135667696e-15 eV s, k_B = 8.617333262e-5 eV/K,
    // κ_el = 2P₀/(1 + P₀) with P₀ = 1 − e^(−γ) (Newton & Sutin 1984, from memory).
    const gamma =
      (Math.PI ** 1.5 * 0.05 ** 2) /
      (4.135667696e-15 * 1e13 * Math.sqrt(0.8 * 8.617333262e-5 * 298.15));
    const p0 = 1 - Math.exp(-gamma);
    const kappa = (2 * p0) / (1 + p0);
    const el = render('intermediate', 0.05);
    expect(text(el, 'h2')).toContain('intermediate');
    expect(text(el, '.kappa')).toContain(String(Number(kappa.toPrecision(3))));
    expect(text(el, '.kappa')).toContain(`γ = ${Number(gamma.toPrecision(3))}`);
    // Brunschwig–Sutin closed form (λ + ΔG°)²/(4λ) − |H| + H²/(λ + ΔG°) = 0.033125 eV, which
    // SCIENCE.md §3 says is 0.0043 eV (11 %) below the exact barrier of the two-state surfaces.
    const closed = 0.5 ** 2 / 3.2 - 0.05 + 0.05 ** 2 / 0.5;
    expect(text(el, '.barrier')).toContain(`closed form ${Number(closed.toPrecision(3))} eV`);
    const exact = Number(text(el, '.barrier')!.split(' ')[0]);
    expect(exact - closed).toBeCloseTo(0.0043, 3);
  });

  it('says why there is no barrier for a class III pair (2|H| ≥ λ)', () => {
    const el = render('adiabatic', 0.5, 0, 0.8);
    expect(el.querySelector('.refused')).not.toBeNull();
    expect(el.querySelector('.k-ad')).toBeNull();
  });
});
