import { TestBed } from '@angular/core/testing';
import type { SeriesFit } from '@gapwise/contracts';
import { FitTable } from './fit-table';

/** A fit as the API answers it (invented numbers with many digits, as the optimizer gives). */
const FIT = {
  preferred: 'marcus',
  hbarOmega: 0.18,
  lambdaVib: 0.25,
  fits: {
    marcus: {
      model: 'marcus',
      lambda: 0.97512345678,
      coupling: 0.000397123456,
      standardErrors: { lambda: 0.0291234, coupling: 0.0000391234 },
      correlation: 0.0234,
      rmsLog10Residual: 0.2134,
      aic: -20.91,
      bic: -20.71,
      warnings: [],
    },
  },
} as unknown as SeriesFit;

describe('FitTable', () => {
  it('rounds each fitted value to the decimal place its standard error supports', () => {
    const fixture = TestBed.createComponent(FitTable);
    fixture.componentRef.setInput('fit', FIT);
    fixture.componentRef.setInput('temperature', 298.15);
    fixture.detectChanges();
    const el = fixture.nativeElement as HTMLElement;
    const cells = Array.from(el.querySelectorAll('tbody tr td'), (c) => c.textContent!.trim());
    expect(cells[0]).toBe('0.975 ± 0.029');
    expect(cells[1]).toBe('0.397 ± 0.039');
    expect(el.textContent).not.toContain('0.97512');
    // The caption has no space before its semicolons.
    const caption = el.querySelector('caption')!.textContent!.trim();
    expect(caption).toBe(
      'Fitted parameters (± one standard error; T = 298.15 K; fixed mode ħω = 0.18 eV, λᵥ = 0.25 eV)',
    );
  });
});
