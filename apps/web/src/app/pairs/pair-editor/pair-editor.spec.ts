import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatDialog } from '@angular/material/dialog';
import { MatTooltip } from '@angular/material/tooltip';
import { By } from '@angular/platform-browser';
import { provideRouter } from '@angular/router';
import { calculate, CM1_PER_EV } from '@gapwise/calc';
import { of } from 'rxjs';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import type { DerivationResult } from '../derivation/derivation-dialog';
import { ParameterFieldHarness } from '../parameter-field/testing/parameter-field-harness';
import { PairEditor } from './pair-editor';

const settle = () => new Promise((resolve) => setTimeout(resolve, 40));

async function setup(role: 'editor' | 'viewer', dialogResult?: DerivationResult) {
  const open = vi.fn(() => ({ afterClosed: () => of(dialogResult) }));
  TestBed.configureTestingModule({
    providers: [
      provideRouter([]),
      provideHttpClient(),
      provideHttpClientTesting(),
      { provide: MatDialog, useValue: { open } },
      {
        provide: WorkspaceContext,
        useValue: {
          role: signal(role),
          canEdit: signal(role === 'editor'),
          canManageMembers: signal(false),
          workspaceId: signal('w1'),
          current: signal(null),
        },
      },
    ],
  });
  const fixture = TestBed.createComponent(PairEditor);
  fixture.componentRef.setInput('wid', 'w1');
  fixture.detectChanges();
  await fixture.whenStable();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  return { fixture, loader, open, editor: fixture.componentInstance };
}

describe('PairEditor', { timeout: 40_000 }, () => {
  it('fills |H_AB| from a derivation helper and records it as derived with its inputs', async () => {
    const inputs = {
      coupling0: { value: 0.05, unit: 'eV' },
      distance0: { value: 3.5, unit: 'A' },
      beta: { value: 1.1, unit: 'A-1' },
      distance: { value: 10, unit: 'A' },
    };
    const answer = calculate({ method: 'coupling.distanceDecay', inputs });
    expect(answer.ok).toBe(true);
    const coupling = answer.ok ? (answer.outputs['coupling'] as number) : NaN;
    const { fixture, loader, open } = await setup('editor', {
      methodId: 'coupling.distanceDecay',
      methodInputs: inputs,
      values: [{ kind: 'coupling', value: coupling }],
    });
    const field = await loader.getHarness(ParameterFieldHarness.with({ kind: 'coupling' }));
    await field.derive(/distance decay/);
    expect(open).toHaveBeenCalledTimes(1);
    fixture.detectChanges();

    // Shown in the field's unit (cm⁻¹) with the digits a derived value supports (4 significant
    // figures, no σ), stored canonically (eV) at full precision.
    const shownText = await field.getValue();
    expect(shownText).toBe(
      String(Number((Number(coupling.toPrecision(4)) * CM1_PER_EV).toPrecision(6))),
    );
    expect(shownText.replace(/[^0-9]/g, '').length).toBeLessThanOrEqual(7);
    expect(await field.getProvenance()).toBe('Derived');
    expect(await field.getDerivedMethod()).toBe('distance-decay');
    // The badge's tooltip is the provenance sentence the report prints: labels and units, no JSON.
    const badge = fixture.debugElement.query(By.css('.derived-badge'));
    expect(badge.injector.get(MatTooltip).message).toBe(
      'Derived with the distance-decay helper from coupling H₀ at the reference distance = 0.05 eV, ' +
        'reference distance R₀ = 3.5 Å, decay constant β of the rate = 1.1 Å⁻¹, distance R = 10 Å.',
    );
    const group = fixture.componentInstance['store'].form().controls.parameters.controls.coupling;
    expect(group.controls.value.value).toBe(coupling);
    expect(group.controls.provenance.getRawValue()).toMatchObject({
      kind: 'derived',
      methodId: 'coupling.distanceDecay',
      methodInputs: inputs,
    });
  });

  it('recomputes log10 k in the browser as values are typed in mixed units', async () => {
    const { fixture, loader } = await setup('editor');
    const get = (kind: string) => loader.getHarness(ParameterFieldHarness.with({ kind }));
    const dg = await get('deltaG0');
    await dg.selectUnit('kcal/mol');
    await dg.setValue('-6.918');
    const lo = await get('lambdaOuter');
    await lo.setValue('0.8');
    const h = await get('coupling');
    await h.setValue('80.655');
    await settle();
    fixture.detectChanges();
    await fixture.whenStable();
    // Same request through the one dispatcher: ΔG° = −6.918 kcal/mol, λ = 0.8 eV, 80.655 cm⁻¹.
    const expected = calculate({
      method: 'rate.marcus',
      inputs: {
        deltaG0: { value: -6.918, unit: 'kcal/mol' },
        lambda: 0.8,
        coupling: { value: 80.655, unit: 'cm-1' },
        temperature: 298.15,
      },
    });
    const log10k = expected.ok ? (expected.outputs['log10k'] as number) : NaN;
    const shown = (fixture.nativeElement as HTMLElement).querySelector('[data-testid="log10k"]');
    expect(shown?.textContent?.trim()).toBe(log10k.toFixed(2));
    expect(
      (fixture.nativeElement as HTMLElement).querySelector('path.curve.reactant'),
    ).not.toBeNull();
  });

  it('is read-only for a viewer', async () => {
    const { fixture, loader } = await setup('viewer');
    const field = await loader.getHarness(ParameterFieldHarness.with({ kind: 'lambdaOuter' }));
    const el: HTMLElement = fixture.nativeElement;
    expect(el.querySelector('.readonly-banner')?.textContent).toMatch(/Read-only/);
    expect(el.querySelector('button.save')).toBeNull();
    expect(
      el.querySelector<HTMLInputElement>(
        'gw-parameter-field[data-kind="lambdaOuter"] input.value-input',
      )!.disabled,
    ).toBe(true);
    expect(await field.getValue()).toBe('');
  });
});
