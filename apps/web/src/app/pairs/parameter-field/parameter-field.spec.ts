import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { fromCanonical, KCAL_PER_MOL_PER_EV } from '@gapwise/calc';
import { createParameterGroup } from '../pair-form/pair-form';
import { ParameterField } from './parameter-field';
import { ParameterFieldHarness } from './testing/parameter-field-harness';

@Component({
  imports: [ParameterField],
  template: `<gw-parameter-field [group]="lambda" kind="lambdaOuter" />
    <gw-parameter-field [group]="coupling" kind="coupling" />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly lambda = createParameterGroup('lambdaOuter');
  readonly coupling = createParameterGroup('coupling');
}

async function setup() {
  const fixture = TestBed.createComponent(Host);
  fixture.detectChanges();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const lambda = await loader.getHarness(ParameterFieldHarness.with({ kind: 'lambdaOuter' }));
  const coupling = await loader.getHarness(ParameterFieldHarness.with({ kind: 'coupling' }));
  return { host: fixture.componentInstance, lambda, coupling };
}

describe('ParameterField', () => {
  it('keeps a confirmed value exactly through eV → kcal/mol → eV', async () => {
    const { host, lambda } = await setup();
    expect(await lambda.getUnit()).toBe('eV');
    await lambda.setValue('0.85');
    await lambda.confirm();
    expect(host.lambda.controls.value.value).toBe(0.85);

    await lambda.selectUnit('kcal/mol');
    expect(await lambda.getUnit()).toBe('kcal/mol');
    // 0.85 eV × 23.06054783 kcal/mol per eV (CODATA 2018, SCIENCE.md §16).
    expect(Number(await lambda.getValue())).toBeCloseTo(0.85 * KCAL_PER_MOL_PER_EV, 9);
    expect(host.lambda.controls.value.value).toBe(0.85);

    await lambda.selectUnit('eV');
    expect(await lambda.getValue()).toBe('0.85');
    expect(host.lambda.controls.value.value).toBe(0.85);
    expect(host.lambda.controls.unit.value).toBe('eV');
  });

  it('stores a value typed in cm⁻¹ canonically and converts its uncertainty without offset', async () => {
    const { host, coupling } = await setup();
    expect(await coupling.getUnit()).toBe('cm⁻¹');
    await coupling.setValue('1.2e2');
    await coupling.setUncertainty('30');
    await coupling.confirm();
    // 120 cm⁻¹ / 8065.543937 cm⁻¹ per eV.
    expect(host.coupling.controls.value.value).toBeCloseTo(120 / 8065.543937, 15);
    expect(host.coupling.controls.uncertainty.value).toBeCloseTo(30 / 8065.543937, 15);
    await coupling.selectUnit('meV');
    expect(Number(await coupling.getValue())).toBeCloseTo(
      fromCanonical(120 / 8065.543937, 'meV', 'energy'),
      9,
    );
    expect(Number(await coupling.getUncertainty())).toBeCloseTo((30 / 8065.543937) * 1000, 9);
  });

  it('reads a typed, unconfirmed value in the unit picked next and says so, with Undo', async () => {
    const { host, lambda } = await setup();
    await lambda.setValue('20');
    await lambda.selectUnit('kcal/mol');
    // 20 kcal/mol ÷ 23.06054783 kcal/mol per eV (CODATA 2018, SCIENCE.md §16).
    expect(await lambda.getValue()).toBe('20');
    expect(host.lambda.controls.value.value).toBeCloseTo(20 / KCAL_PER_MOL_PER_EV, 12);
    expect(await lambda.getUnitChange()).toBe('20 is now read as 20 kcal/mol');

    await lambda.undoUnitChange();
    expect(await lambda.getUnit()).toBe('eV');
    expect(host.lambda.controls.value.value).toBe(20);
    expect(await lambda.getUnitChange()).toBeNull();
  });

  it('converts a confirmed value, shows "old → new" and undoes it', async () => {
    const { host, lambda } = await setup();
    await lambda.setValue('1');
    await lambda.confirm();
    await lambda.selectUnit('kcal/mol');
    expect(await lambda.getUnitChange()).toBe(
      `1 eV → ${Number((1 * KCAL_PER_MOL_PER_EV).toPrecision(12))} kcal/mol`,
    );
    expect(host.lambda.controls.value.value).toBe(1);
    await lambda.undoUnitChange();
    expect(await lambda.getValue()).toBe('1');
    expect(await lambda.getUnit()).toBe('eV');
  });

  it('converts a value loaded from a saved version at once', async () => {
    const fixture = TestBed.createComponent(Host);
    fixture.componentInstance.lambda.controls.value.setValue(0.5);
    fixture.componentInstance.lambda.controls.text.setValue('0.5');
    fixture.detectChanges();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const lambda = await loader.getHarness(ParameterFieldHarness.with({ kind: 'lambdaOuter' }));
    await lambda.selectUnit('meV');
    expect(await lambda.getValue()).toBe('500');
    expect(await lambda.getUnitChange()).toBe('0.5 eV → 500 meV');
  });

  it('warns about an implausible value without refusing it (kJ/mol typed as eV)', async () => {
    const { host, lambda } = await setup();
    await lambda.setValue('0.8');
    expect(await lambda.getWarning()).toBeNull();
    await lambda.setValue('96');
    expect(await lambda.getWarning()).toMatch(
      /Outer reorganization energy λₒ = 96 eV looks like kJ\/mol or cm⁻¹ entered as eV/,
    );
    expect(await lambda.getErrorMessages()).toEqual([]);
    expect(host.lambda.controls.value.value).toBe(96);
  });

  it('accepts scientific notation', async () => {
    const { host, lambda } = await setup();
    await lambda.setValue('1.2e-3');
    expect(host.lambda.controls.value.value).toBe(0.0012);
    expect(await lambda.getErrorMessages()).toEqual([]);
  });

  it('names the field and the reason for bad input, and stores nothing', async () => {
    const { host, lambda } = await setup();
    await lambda.setValue('0,85');
    expect((await lambda.getErrorMessages()).join(' ')).toMatch(/decimal point, not a comma/);
    expect(host.lambda.controls.value.value).toBeNull();

    await lambda.setValue('abc');
    expect((await lambda.getErrorMessages()).join(' ')).toMatch(
      /Outer reorganization energy λₒ is not a finite number/,
    );

    await lambda.setValue('-0.2');
    expect((await lambda.getErrorMessages()).join(' ')).toMatch(/must not be negative/);
    expect(host.lambda.controls.value.value).toBeNull();

    await lambda.setValue('0.4');
    expect(await lambda.getErrorMessages()).toEqual([]);
    expect(host.lambda.controls.value.value).toBe(0.4);
  });

  it('draws |H_AB| in the label and its messages with a subscript, never the raw markup', async () => {
    const fixture = TestBed.createComponent(Host);
    fixture.detectChanges();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const coupling = await loader.getHarness(ParameterFieldHarness.with({ kind: 'coupling' }));
    expect(await coupling.getLabel()).toBe('Electronic coupling |HAB|');
    expect(await coupling.getLabelSubscripts()).toEqual(['AB']);
    await coupling.setValue('abc');
    const messages = (await coupling.getErrorMessages()).join(' ');
    expect(messages).toMatch(/Electronic coupling \|HAB\| is not a finite number/);
    const el = fixture.nativeElement as HTMLElement;
    const field = el.querySelector('gw-parameter-field[data-kind="coupling"]')!;
    expect(field.querySelector('mat-error sub')?.textContent).toBe('AB');
    expect(field.textContent).not.toContain('_');
    // Assistive technology hears the same words, without the underscore.
    expect(field.querySelector('.unit-select')?.getAttribute('aria-label')).toBe(
      'Unit of Electronic coupling |HAB|',
    );
  });

  it('offers the five provenance kinds and shows a citation field for literature', async () => {
    const { host, lambda } = await setup();
    expect(await lambda.getProvenance()).toBe('Assumed');
    expect(await lambda.getCitation()).toBeNull();
    await lambda.selectProvenance('Literature');
    expect(host.lambda.controls.provenance.controls.kind.value).toBe('literature');
    expect(await lambda.getCitation()).toBe('');
  });
});
