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

  function open(data: DerivationDialogData) {
    const close = vi.fn();
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
      fixture.detectChanges();
    };
    return { fixture, el, type, close };
  }

  it('flags an absurd GMH coupling (gap typed as 15000 eV) and asks for an override', async () => {
    const { fixture, el, type, close } = open({
      derivation: derivationById('gmh')!,
      prefill: {},
      targetUnit: 'cm-1',
    });
    type('transitionDipole', '2');
    type('dipoleDifference', '16');
    type('transitionEnergy', '15000');
    // GMH: |H| = μ₁₂ΔE₁₂ / √(Δμ₁₂² + 4μ₁₂²) = 2 × 15000 / √(256 + 16) eV (Cave & Newton 1996).
    const expectedEv = (2 * 15000) / Math.sqrt(16 * 16 + 4 * 2 * 2);
    expect(expectedEv).toBeGreaterThan(1800);
    const use = el.querySelector<HTMLButtonElement>('button.use-value')!;
    expect(el.querySelector('.implausible-message')?.textContent).toMatch(
      /Electronic coupling \|HAB\| = 1819 eV is unusually large \(above 0\.5 eV\)/,
    );
    expect(use.disabled).toBe(true);

    el.querySelector<HTMLInputElement>('.override input')!.click();
    fixture.detectChanges();
    await fixture.whenStable();
    expect(use.disabled).toBe(false);
    use.click();
    expect(close.mock.calls[0][0].values[0].value).toBeCloseTo(expectedEv, 9);

    // A plausible gap needs no override: 1.5 eV gives 0.18 eV.
    type('transitionEnergy', '1.5');
    expect(el.querySelector('.implausible-message')).toBeNull();
    expect(use.disabled).toBe(false);
  });

  it('runs Rehm–Weller with both radii once the measurement-solvent ε is given, in user labels', () => {
    const { el, type } = open({
      derivation: derivationById('rehm-weller')!,
      prefill: {
        donorOxidation: { value: 1.2, unit: 'V' },
        acceptorReduction: { value: -0.8, unit: 'V' },
        excitationEnergy: { value: 2.5, unit: 'eV' },
        distance: { value: 7, unit: 'A' },
        epsilon: { value: 8.93, unit: '' },
        radiusDonor: { value: 3.5, unit: 'A' },
        radiusAcceptor: { value: 3.5, unit: 'A' },
      },
      targetUnit: 'eV',
    });
    // Without the ε of the measurement solvent the correction cannot run: the message names the
    // inputs as the dialog labels them, never by code name.
    expect(el.querySelector('.result-value')).toBeNull();
    const messages = el.textContent ?? '';
    expect(messages).toMatch(/donor radius, the acceptor radius and ε of the solvent/);
    expect(messages).not.toMatch(/radiusDonor|radiusAcceptor|epsilonReference/);

    type('epsilonReference', '35.94');
    expect(el.querySelector('.result-value')?.textContent).toContain('eV');
    expect(el.querySelector<HTMLButtonElement>('button.use-value')!.disabled).toBe(false);
  });
});
