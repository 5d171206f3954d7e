import { TestBed } from '@angular/core/testing';
import { ReferencePicker } from './reference-picker';

async function render(code: string, valueV: number | null) {
  TestBed.configureTestingModule({ imports: [ReferencePicker] });
  const fixture = TestBed.createComponent(ReferencePicker);
  fixture.componentRef.setInput('code', code);
  fixture.componentRef.setInput('valueV', valueV);
  fixture.componentRef.setInput('label', 'Donor oxidation potential');
  fixture.detectChanges();
  // mat-select shows the picked option's text once its options exist.
  await fixture.whenStable();
  fixture.detectChanges();
  return fixture;
}

describe('ReferencePicker', () => {
  it('shows the picked scale and the value on the SHE scale with the published offset', async () => {
    // SCE = +0.241 V vs SHE (Bard & Faulkner, Electrochemical Methods, 2nd ed., from memory).
    const el: HTMLElement = (await render('SCE', 0.4)).nativeElement;
    expect(el.querySelector('.reference-select')?.textContent).toContain('SCE');
    expect(el.querySelector('.she-echo')?.textContent?.trim()).toBe('= 0.641 V vs SHE');
  });

  it('goes through the aqueous SCE for Fc⁺/Fc in MeCN (+0.380 V vs SCE, Pavlishchuk & Addison 2000)', async () => {
    const el: HTMLElement = (await render('Fc/MeCN', 0)).nativeElement;
    expect(el.querySelector('.reference-select')?.textContent).toContain('Fc⁺/Fc in MeCN');
    expect(el.querySelector('.she-echo')?.textContent?.trim()).toBe('= 0.621 V vs SHE');
  });

  it('says nothing about SHE when no reference is stated', async () => {
    const el: HTMLElement = (await render('', 0.4)).nativeElement;
    expect(el.querySelector('.reference-select')?.textContent).toContain('not stated');
    expect(el.querySelector('.she-echo')).toBeNull();
  });

  it('offers every scale and emits the one picked', async () => {
    const fixture = await render('', null);
    const picked: string[] = [];
    fixture.componentInstance.codeChange.subscribe((c) => picked.push(c));
    const trigger = fixture.nativeElement.querySelector('.mat-mdc-select-trigger') as HTMLElement;
    trigger.click();
    fixture.detectChanges();
    await fixture.whenStable();
    const options = [...document.querySelectorAll('mat-option')].map((o) => o.textContent!.trim());
    expect(options).toEqual([
      'not stated',
      'SHE',
      'NHE',
      'SCE',
      'Ag/AgCl (saturated KCl)',
      'Ag/AgCl (3 M KCl)',
      'Fc⁺/Fc in MeCN',
      'Fc⁺/Fc in DMF',
      'Fc⁺/Fc in CH2Cl2',
    ]);
    (document.querySelectorAll('mat-option')[6] as HTMLElement).click();
    expect(picked).toEqual(['Fc/MeCN']);
  });
});
