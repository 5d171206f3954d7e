import { TEMPERATURE_SPEC } from './pair-form';
import {
  confirmQuantity,
  createQuantityGroup,
  quantityWarning,
  setCanonicalQuantity,
  switchQuantityUnit,
  typeQuantityText,
} from './quantity-control';

// Exact limiting relation: T/K = t/°C + 273.15 (the definition of the Celsius scale).
describe('switchQuantityUnit: typed values take the unit, confirmed values convert', () => {
  it('reads a typed, unconfirmed 25 in the unit picked next (25 °C = 298.15 K)', () => {
    const t = createQuantityGroup(TEMPERATURE_SPEC, { value: 298.15, unit: 'K' });
    typeQuantityText(t, TEMPERATURE_SPEC, '25');
    expect(t.controls.value.value).toBe(25);

    const change = switchQuantityUnit(t, TEMPERATURE_SPEC, 'degC');
    expect(t.controls.text.value).toBe('25');
    expect(t.controls.unit.value).toBe('degC');
    expect(t.controls.value.value).toBeCloseTo(298.15, 10);
    expect(change?.mode).toBe('reread');
    expect(change?.message).toBe('25 is now read as 25 °C (= 298.15 K)');
  });

  it('converts a loaded (saved) value and says so: 25 K → −248.15 °C, and Undo restores it', () => {
    const t = createQuantityGroup(TEMPERATURE_SPEC, { value: 25, unit: 'K' });
    const change = switchQuantityUnit(t, TEMPERATURE_SPEC, 'degC');
    expect(change?.mode).toBe('converted');
    expect(change?.message).toBe('25 K → −248.15 °C');
    expect(t.controls.value.value).toBe(25);
    expect(Number(t.controls.text.value)).toBeCloseTo(-248.15, 10);

    change!.undo();
    expect(t.controls.unit.value).toBe('K');
    expect(t.controls.text.value).toBe('25');
    expect(t.controls.value.value).toBe(25);
  });

  it('converts a typed value once it is confirmed (Enter), and after a helper put it in', () => {
    const t = createQuantityGroup(TEMPERATURE_SPEC, { value: 298.15, unit: 'K' });
    typeQuantityText(t, TEMPERATURE_SPEC, '300');
    confirmQuantity(t);
    expect(switchQuantityUnit(t, TEMPERATURE_SPEC, 'degC')?.mode).toBe('converted');
    expect(t.controls.value.value).toBe(300);
    expect(Number(t.controls.text.value)).toBeCloseTo(26.85, 10);

    typeQuantityText(t, TEMPERATURE_SPEC, '10');
    setCanonicalQuantity(t, TEMPERATURE_SPEC, 77);
    expect(switchQuantityUnit(t, TEMPERATURE_SPEC, 'K')?.message).toBe('−196.15 °C → 77 K');
  });

  it('undoes a re-read: the typed number goes back to its old unit and value', () => {
    const t = createQuantityGroup(TEMPERATURE_SPEC, { value: 298.15, unit: 'K' });
    typeQuantityText(t, TEMPERATURE_SPEC, '25');
    switchQuantityUnit(t, TEMPERATURE_SPEC, 'degC')!.undo();
    expect(t.controls.unit.value).toBe('K');
    expect(t.controls.value.value).toBe(25);
    expect(t.controls.pending.value).toBe(true);
  });

  it('says nothing when the field is empty or the unit is unchanged', () => {
    const t = createQuantityGroup(TEMPERATURE_SPEC, { value: null, unit: 'K' });
    expect(switchQuantityUnit(t, TEMPERATURE_SPEC, 'degC')).toBeNull();
    expect(switchQuantityUnit(t, TEMPERATURE_SPEC, 'degC')).toBeNull();
  });

  it('warns below 150 K and above 500 K but keeps the value valid', () => {
    const t = createQuantityGroup(TEMPERATURE_SPEC, { value: 298.15, unit: 'K' });
    expect(quantityWarning(t, TEMPERATURE_SPEC)).toBeNull();
    typeQuantityText(t, TEMPERATURE_SPEC, '25');
    expect(t.controls.text.valid).toBe(true);
    expect(quantityWarning(t, TEMPERATURE_SPEC)).toMatch(/25 K is outside 150–500 K/);
    typeQuantityText(t, TEMPERATURE_SPEC, '600');
    expect(quantityWarning(t, TEMPERATURE_SPEC)).toMatch(/600 K is outside 150–500 K/);
    typeQuantityText(t, TEMPERATURE_SPEC, '150');
    expect(quantityWarning(t, TEMPERATURE_SPEC)).toBeNull();
  });
});
