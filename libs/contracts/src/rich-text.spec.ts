import { describe, expect, it } from 'vitest';
import { plainText, textRuns } from './rich-text';

const subs = (text: string) =>
  textRuns(text)
    .filter((r) => r.sub)
    .map((r) => r.text);

describe('textRuns', () => {
  it('lowers the letters after _ (the labels of PARAMETER_KINDS and the calc messages)', () => {
    expect(textRuns('Electronic coupling |H_AB|')).toEqual([
      { text: 'Electronic coupling |H', sub: false },
      { text: 'AB', sub: true },
      { text: '|', sub: false },
    ]);
    expect(subs('Longitudinal relaxation time τ_L')).toEqual(['L']);
    expect(subs('E_ox(D⁺/D) and E_red(A/A⁻)')).toEqual(['ox', 'red']);
    expect(subs('−ΔG°_CR > λ, ⟨ΔE⟩_R, σ_P²')).toEqual(['CR', 'R', 'P']);
  });

  it('takes _{…} for longer subscripts and lowers only the B of k_BT', () => {
    expect(textRuns('√(4πλ_s k_{B}T)')).toEqual([
      { text: '√(4πλ', sub: false },
      { text: 's', sub: true },
      { text: ' k', sub: false },
      { text: 'B', sub: true },
      { text: 'T)', sub: false },
    ]);
    expect(plainText('|H_AB| is well below k_BT.')).toBe('|HAB| is well below kBT.');
    expect(subs('ħω below 4k_BT; σ_R²/(2k_BT); exp(−ΔG‡/k_BT)')).toEqual(['B', 'R', 'B', 'B']);
    expect(subs('(4λk_BT) and ⟨ΔE_R⟩ and 4πλ_s')).toEqual(['B', 'R', 's']);
  });

  it('leaves names with underscores as they were typed', () => {
    for (const name of ["unknown solvent 'my_solvent'", 'run_2.csv', 'S3_BUCKET', 'gw_calc_031']) {
      expect(textRuns(name)).toEqual([{ text: name, sub: false }]);
    }
    expect(subs('E_initial(geom_final)')).toEqual(['initial']);
  });

  it('keeps text without markup whole, and the empty string empty', () => {
    expect(textRuns('ΔG° = −0.3 eV')).toEqual([{ text: 'ΔG° = −0.3 eV', sub: false }]);
    expect(textRuns('')).toEqual([]);
    expect(plainText('')).toBe('');
    expect(plainText('2|H_AB| ≥ λ')).toBe('2|HAB| ≥ λ');
  });
});
