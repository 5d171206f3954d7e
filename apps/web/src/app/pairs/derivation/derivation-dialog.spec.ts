import { TestBed } from '@angular/core/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { calculate } from '@gapwise/calc';
import { DerivationDialog, type DerivationDialogData } from './derivation-dialog';
import { derivationById } from './derivations';

describe('DerivationDialog', () => {
  it('runs reorg.twoSphere on the typed inputs and hands back value, method and inputs', async () => {
    const close = vi.fn();
    const data: DerivationDialogData = {
      derivation: derivationById('two-sphere')!,
      prefill: { radiusDonor: { value: 4, unit: 'A' }, distance: { value: 10, unit: 'nm' } },
      targetUnit: 'kcal/mol',
    };
    TestBed.configureTestingModule({
      providers: [
        { provide: MAT_DIALOG_DATA, useValue: data },
        { provide: MatDialogRef, useValue: { close } },
      ],
    });
    const fixture = TestBed.createComponent(DerivationDialog);
    fixture.detectChanges();
    const el: HTMLElement = fixture.nativeElement;
    const type = (name: string, text: string) => {
      const input = el.querySelector<HTMLInputElement>(`.row[data-input="${name}"] input`)!;
      input.value = text;
      input.dispatchEvent(new Event('input'));
    };
    // Pre-filled from the pair: donor radius 4 Å and R = 1 nm shown in the typed unit.
    expect(el.querySelector<HTMLInputElement>('.row[data-input="distance"] input')!.value).toBe(
      '1',
    );
    type('radiusAcceptor', '3.5');
    type('epsilon', '35.9');
    type('refractiveIndex', '1.344');
    fixture.detectChanges();
    await fixture.whenStable();

    const expected = calculate({
      method: 'reorg.twoSphere',
      inputs: {
        radiusDonor: { value: 4, unit: 'A' },
        radiusAcceptor: { value: 3.5, unit: 'A' },
        distance: { value: 1, unit: 'nm' },
        epsilon: 35.9,
        refractiveIndex: 1.344,
      },
    });
    expect(expected.ok).toBe(true);
    const lambdaOuter = expected.ok ? (expected.outputs['lambdaOuter'] as number) : NaN;
    expect(el.querySelector('.result-value')!.textContent).toContain('kcal/mol');

    el.querySelector<HTMLButtonElement>('button.use-value')!.click();
    expect(close).toHaveBeenCalledTimes(1);
    const result = close.mock.calls[0][0];
    expect(result.methodId).toBe('reorg.twoSphere');
    expect(result.values).toEqual([{ kind: 'lambdaOuter', value: lambdaOuter }]);
    expect(result.methodInputs).toMatchObject({
      radiusAcceptor: { value: 3.5, unit: 'A' },
      distance: { value: 1, unit: 'nm' },
      epsilon: 35.9,
    });
  });

  it('shows the core refusal on the field and offers no value', async () => {
    TestBed.configureTestingModule({
      providers: [
        {
          provide: MAT_DIALOG_DATA,
          useValue: { derivation: derivationById('two-sphere')!, prefill: {}, targetUnit: 'eV' },
        },
        { provide: MatDialogRef, useValue: { close: vi.fn() } },
      ],
    });
    const fixture = TestBed.createComponent(DerivationDialog);
    fixture.detectChanges();
    const el: HTMLElement = fixture.nativeElement;
    for (const [name, text] of [
      ['radiusDonor', '4'],
      ['radiusAcceptor', '4'],
      ['distance', '5'],
      ['epsilon', '35.9'],
      ['refractiveIndex', '1.344'],
    ]) {
      const input = el.querySelector<HTMLInputElement>(`.row[data-input="${name}"] input`)!;
      input.value = text;
      input.dispatchEvent(new Event('input'));
    }
    fixture.detectChanges();
    // R = 5 Å < a_D + a_A = 8 Å: the spheres overlap (VALIDATION.md A11).
    expect(el.textContent).toMatch(/aD \+ aA|overlap|≥/);
    // Labels and messages draw a_D, ε_s as subscripts, never the raw markup.
    expect(el.textContent).not.toContain('_');
    const donor = el.querySelector(
      '.row[data-input="radiusDonor"] mat-label, .row[data-input="radiusDonor"] label',
    );
    expect(donor?.querySelector('sub')?.textContent).toBe('D');
    expect(el.querySelector<HTMLButtonElement>('button.use-value')!.disabled).toBe(true);
  });
});
