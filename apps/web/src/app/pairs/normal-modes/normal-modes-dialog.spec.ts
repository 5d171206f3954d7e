import { TestBed } from '@angular/core/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { NormalModesDialog, type NormalModesDialogData } from './normal-modes-dialog';

// 1 eV = 8065.543937 cm⁻¹ (CODATA 2018, SCIENCE.md §16).
const CM1_PER_EV = 8065.543937;

function setup(temperatureK: number | null = 298.15) {
  const close = vi.fn();
  const data: NormalModesDialogData = { temperatureK };
  TestBed.configureTestingModule({
    providers: [
      { provide: MAT_DIALOG_DATA, useValue: data },
      { provide: MatDialogRef, useValue: { close } },
    ],
  });
  const fixture = TestBed.createComponent(NormalModesDialog);
  fixture.detectChanges();
  const el: HTMLElement = fixture.nativeElement;
  const type = (mode: number, cls: 'omega-input' | 'weight-input', text: string) => {
    const input = el.querySelector<HTMLInputElement>(`.mode[data-mode="${mode}"] .${cls}`)!;
    input.value = text;
    input.dispatchEvent(new Event('input'));
    fixture.detectChanges();
  };
  return { fixture, el, type, close };
}

describe('NormalModesDialog', () => {
  it('sums λ_v = Σ S_j ħω_j, the λ-weighted ħω and ΣS_j, and fills λᵢ and ħω as derived', () => {
    const { el, type, close } = setup();
    type(1, 'omega-input', '1600');
    type(1, 'weight-input', '1.1');
    type(2, 'omega-input', '400');
    type(2, 'weight-input', '0.32');
    // Hand computation: λ_v = (1.1·1600 + 0.32·400) cm⁻¹ = 1888 cm⁻¹; ħω_eff = Σλ_jω_j/Σλ_j =
    // (1760·1600 + 128·400)/1888 = 1518.64 cm⁻¹ (Huang & Rhys 1950; Jortner 1976, from memory).
    const lambdaVib = 1888 / CM1_PER_EV;
    const omega = (1760 * 1600 + 128 * 400) / 1888 / CM1_PER_EV;
    expect(el.querySelector('.lambda-vib')?.textContent?.trim()).toBe(
      `${Number(lambdaVib.toPrecision(4))} eV`,
    );
    expect(el.querySelector('.effective-omega')?.textContent).toContain('1519 cm⁻¹');
    expect(el.querySelector('.s-total')?.textContent?.trim()).toBe('1.42');
    // 400 cm⁻¹ = 0.0496 eV < 4 k_BT = 0.103 eV at 298.15 K: the core's thermal-MLJ hint.
    expect(el.querySelector('.warning')?.textContent).toContain('mode 2');

    el.querySelector<HTMLButtonElement>('.use-value')!.click();
    const result = close.mock.calls[0]![0];
    expect(result.methodId).toBe('reorg.normalModes');
    expect(result.values[0].kind).toBe('lambdaInner');
    expect(result.values[0].value).toBeCloseTo(lambdaVib, 12);
    expect(result.values[1].kind).toBe('hbarOmega');
    expect(result.values[1].value).toBeCloseTo(omega, 12);
    // Provenance keeps the modes as typed.
    expect(result.methodInputs.modes).toEqual([
      { hbarOmega: { value: 1600, unit: 'cm-1' }, huangRhys: 1.1 },
      { hbarOmega: { value: 400, unit: 'cm-1' }, huangRhys: 0.32 },
    ]);
  });

  it('takes dimensionless displacements instead (S = Δ²/2, exact)', () => {
    const { el, fixture, type } = setup(null);
    el.querySelectorAll<HTMLButtonElement>('.weight-toggle button')[1]!.click();
    fixture.detectChanges();
    type(1, 'omega-input', '1600');
    type(1, 'weight-input', '2');
    // Δ = 2 → S = 2; λ_v = 2 · 1600 cm⁻¹.
    expect(el.querySelector('.s-total')?.textContent?.trim()).toBe('2');
    expect(el.querySelector('.lambda-vib')?.textContent?.trim()).toBe(
      `${Number((3200 / CM1_PER_EV).toPrecision(4))} eV`,
    );
  });

  it('names the mode and the field of a refused input, and offers nothing to use', () => {
    const { el, type } = setup();
    type(1, 'omega-input', '1600');
    type(1, 'weight-input', '1');
    type(2, 'omega-input', '-5');
    type(2, 'weight-input', '0.5');
    expect(el.querySelector('.input-error')?.textContent).toContain('Mode 2, ħω');
    expect(el.querySelector<HTMLButtonElement>('.use-value')!.disabled).toBe(true);
  });
});
