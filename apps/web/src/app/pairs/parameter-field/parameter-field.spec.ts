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
  it('keeps the typed value exactly through eV → kcal/mol → eV', async () => {
    const { host, lambda } = await setup();
    expect(await lambda.getUnit()).toBe('eV');
    await lambda.setValue('0.85');
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
