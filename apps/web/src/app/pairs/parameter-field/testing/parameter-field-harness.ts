import { ComponentHarness, HarnessPredicate, type BaseHarnessFilters } from '@angular/cdk/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { MatSelectHarness } from '@angular/material/select/testing';

export interface ParameterFieldHarnessFilters extends BaseHarnessFilters {
  /** Parameter kind, e.g. `lambdaOuter`. */
  kind?: string;
}

/** Test surface of `gw-parameter-field`: type values, switch units, read errors and provenance. */
export class ParameterFieldHarness extends ComponentHarness {
  static hostSelector = 'gw-parameter-field';

  static with(options: ParameterFieldHarnessFilters = {}): HarnessPredicate<ParameterFieldHarness> {
    return new HarnessPredicate(ParameterFieldHarness, options).addOption(
      'kind',
      options.kind,
      async (harness, kind) => (await (await harness.host()).getAttribute('data-kind')) === kind,
    );
  }

  private readonly valueInput = this.locatorFor(MatInputHarness.with({ selector: '.value-input' }));
  private readonly uncertaintyInput = this.locatorFor(
    MatInputHarness.with({ selector: '.uncertainty-input' }),
  );
  private readonly unitSelect = this.locatorForOptional(
    MatSelectHarness.with({ selector: '.unit-select' }),
  );
  private readonly provenanceSelect = this.locatorFor(
    MatSelectHarness.with({ selector: '.provenance-select' }),
  );
  private readonly citationInput = this.locatorForOptional(
    MatInputHarness.with({ selector: '.citation-input' }),
  );
  private readonly valueErrors = this.locatorForAll('.value-error');
  private readonly calcErrors = this.locatorForAll('.calc-error');
  private readonly labelEl = this.locatorFor('.label');
  private readonly valueInputEl = this.locatorFor('.value-input');
  private readonly unitChangeText = this.locatorForOptional('.unit-change-text');
  private readonly unitChangeUndo = this.locatorForOptional('.unit-change-undo');
  private readonly plausibilityEl = this.locatorForOptional('.plausibility');
  private readonly labelSubs = this.locatorForAll('.label sub');
  private readonly badge = this.locatorForOptional('.derived-badge');
  private readonly deriveMenu = this.locatorForOptional(
    MatMenuHarness.with({ selector: '.derive' }),
  );

  /** The label as it reads on screen, subscripts inline (`Electronic coupling |HAB|`). */
  async getLabel(): Promise<string> {
    return (await this.labelEl()).text();
  }

  /** The subscripts of the label (`['AB']` for |H_AB|). */
  async getLabelSubscripts(): Promise<string[]> {
    return Promise.all((await this.labelSubs()).map((s) => s.text()));
  }

  async getValue(): Promise<string> {
    return (await this.valueInput()).getValue();
  }

  /** Replaces the text, as a user typing it would. */
  async setValue(text: string): Promise<void> {
    await (await this.valueInput()).setValue(text);
  }

  async getUncertainty(): Promise<string> {
    return (await this.uncertaintyInput()).getValue();
  }

  async setUncertainty(text: string): Promise<void> {
    await (await this.uncertaintyInput()).setValue(text);
  }

  /** The unit as shown (e.g. `kcal/mol`, `cm⁻¹`); empty for dimensionless parameters. */
  async getUnit(): Promise<string> {
    const select = await this.unitSelect();
    return select ? select.getValueText() : '';
  }

  async selectUnit(shown: string): Promise<void> {
    const select = await this.unitSelect();
    if (!select) throw new Error('This parameter has no unit.');
    await select.open();
    await select.clickOptions({ text: shown });
  }

  /** Commits the typed value with Enter, so a later unit change converts it. */
  async confirm(): Promise<void> {
    await (await this.valueInputEl()).dispatchEvent('keydown', { key: 'Enter' });
  }

  /** The note shown after a unit change ("25 K → −248.15 °C"), or null. */
  async getUnitChange(): Promise<string | null> {
    const el = await this.unitChangeText();
    return el ? el.text() : null;
  }

  async undoUnitChange(): Promise<void> {
    const button = await this.unitChangeUndo();
    if (!button) throw new Error('No unit change to undo.');
    await button.click();
  }

  /** The plausibility warning under the field (VALIDATION.md B9–B11), or null. */
  async getWarning(): Promise<string | null> {
    const el = await this.plausibilityEl();
    return el ? el.text() : null;
  }

  async getProvenance(): Promise<string> {
    return (await this.provenanceSelect()).getValueText();
  }

  async selectProvenance(shownStartsWith: string | RegExp): Promise<void> {
    const select = await this.provenanceSelect();
    await select.open();
    await select.clickOptions({
      text: shownStartsWith instanceof RegExp ? shownStartsWith : new RegExp(`^${shownStartsWith}`),
    });
  }

  async getCitation(): Promise<string | null> {
    const input = await this.citationInput();
    return input ? input.getValue() : null;
  }

  async getErrorMessages(): Promise<string[]> {
    const all = [...(await this.valueErrors()), ...(await this.calcErrors())];
    return Promise.all(all.map((e) => e.text()));
  }

  /** Helper name shown on the "derived" badge ("distance-decay"), or null. */
  async getDerivedMethod(): Promise<string | null> {
    const b = await this.badge();
    return b ? (await b.text()).replace('functions', '').trim() : null;
  }

  async isReadonly(): Promise<boolean> {
    return (await this.valueInput()).isReadonly();
  }

  /** Opens the derivation menu and picks one helper by its label. */
  async derive(label: string | RegExp): Promise<void> {
    const menu = await this.deriveMenu();
    if (!menu) throw new Error('No derivation helper for this parameter.');
    await menu.open();
    await menu.clickItem({ text: label });
  }
}
