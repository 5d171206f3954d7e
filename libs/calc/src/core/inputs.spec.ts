import { describe, expect, it } from 'vitest';
import { parseStrictNumber, RequestInputReader, WarningCollector } from './inputs';

describe('RequestInputReader', () => {
  it('reads bare canonical numbers and { value, unit } objects', () => {
    const reader = new RequestInputReader({
      a: 0.5,
      b: { value: 500, unit: 'meV' },
      t: { value: 25, unit: 'degC' },
    });
    expect(reader.quantity('a', 'energy')).toBe(0.5);
    expect(reader.quantity('b', 'energy')).toBeCloseTo(0.5, 15);
    expect(reader.quantity('t', 'temperature')).toBeCloseTo(298.15, 12);
    expect(reader.unitOf('a')).toBe('');
    expect(reader.unitOf('b')).toBe('meV');
    expect(reader.failed).toBe(false);
    expect(reader.echo).toEqual({ a: 0.5, b: 0.5, t: 298.15 });
  });

  it('refuses NaN, ±Infinity, strings, empty strings, locale commas, null and booleans (A3)', () => {
    const bad = {
      a: Number.NaN,
      b: Number.POSITIVE_INFINITY,
      c: '1.5',
      d: '',
      e: '1,5',
      f: null,
      g: true,
      h: { value: '2' },
    };
    const reader = new RequestInputReader(bad);
    for (const name of Object.keys(bad)) expect(reader.quantity(name, 'energy')).toBeNaN();
    expect(reader.fieldErrors).toEqual(
      Object.keys(bad).map((field) => ({
        field,
        message: `Field ${field} is not a finite number.`,
      })),
    );
  });

  it('refuses unknown units, unexpected keys and missing required fields', () => {
    const reader = new RequestInputReader({
      a: { value: 1, unit: 'kcal' },
      b: { value: 1, units: 'eV' },
    });
    reader.quantity('a', 'energy');
    reader.quantity('b', 'energy');
    reader.quantity('c', 'distance');
    expect(reader.fieldErrors).toEqual([
      {
        field: 'a',
        message:
          "Unrecognised unit 'kcal' for an energy; use one of eV, meV, kJ/mol, kcal/mol, cm-1, hartree.",
      },
      {
        field: 'b',
        message: "Field b has unexpected key 'units'; give a number or { value, unit }.",
      },
      { field: 'c', message: 'Field c is required.' },
    ]);
  });

  it('checks bounds in the canonical unit with the given or a default message', () => {
    const reader = new RequestInputReader({ t: { value: -300, unit: 'degC' }, x: 0 });
    reader.quantity('t', 'temperature', { greaterThan: 0, message: 'Temperature must be > 0 K.' });
    reader.quantity('x', 'energy', { greaterThan: 0 });
    expect(reader.fieldErrors).toEqual([
      { field: 't', message: 'Temperature must be > 0 K.' },
      { field: 'x', message: 'Field x must be greater than 0 eV.' },
    ]);
  });

  it('uses defaults for absent optional fields and reports fields nobody read', () => {
    const reader = new RequestInputReader({ used: 1, typo: 2 });
    expect(reader.number('used')).toBe(1);
    expect(reader.quantity('z', 'rateSecondOrder', { defaultValue: 1e11 })).toBe(1e11);
    expect(reader.optionalNumber('absent')).toBeUndefined();
    expect(reader.unknownFields()).toEqual(['typo']);
  });

  it('reads integers and choices', () => {
    const reader = new RequestInputReader({ n: 2.5, m: 3, model: 'mlj', other: 'x' });
    expect(reader.integer('n')).toBeNaN();
    expect(reader.integer('m')).toBe(3);
    expect(reader.choice('model', ['marcus', 'mlj'] as const)).toBe('mlj');
    reader.choice('other', ['marcus', 'mlj'] as const);
    expect(reader.fieldErrors.map((e) => e.message)).toEqual([
      'Field n must be an integer.',
      'Field other must be one of marcus, mlj.',
    ]);
  });

  it('reads arrays, naming each bad element and capping the list at 20', () => {
    const reader = new RequestInputReader({
      xs: [1, { value: 2, unit: 'kJ/mol' }, 'a', null],
      many: Array(25).fill('x'),
    });
    const xs = reader.quantityArray('xs', 'energy');
    expect(xs[0]).toBe(1);
    expect(xs[1]).toBeCloseTo(2 / 96.48533212, 15);
    reader.quantityArray('many', 'energy');
    const fields = reader.fieldErrors.map((e) => e.field);
    expect(fields.slice(0, 2)).toEqual(['xs[2]', 'xs[3]']);
    expect(fields.filter((f) => f.startsWith('many[')).length).toBe(20);
    expect(reader.fieldErrors.at(-1)).toEqual({
      field: 'many',
      message: '5 more elements of many are invalid.',
    });
  });

  it('gives nested readers whose errors and unknown fields name the element', () => {
    const reader = new RequestInputReader({
      points: [
        { k: 1, deltaG0: 0 },
        { k: -1, extra: 1 },
      ],
    });
    const children = reader.objectArray('points', { minLength: 1 });
    children.forEach((child) => {
      child.quantity('deltaG0', 'energy');
      child.quantity('k', 'rateFirstOrder', { greaterThan: 0 });
    });
    expect(reader.fieldErrors.map((e) => e.field)).toEqual(['points[1].deltaG0', 'points[1].k']);
    expect(reader.unknownFields()).toEqual(['points[1].extra']);
  });

  it('refuses inputs that are not an object', () => {
    expect(new RequestInputReader([1, 2]).fieldErrors).toEqual([
      { field: 'inputs', message: 'Field inputs must be a JSON object.' },
    ]);
  });
});

describe('parseStrictNumber', () => {
  it('accepts decimal point and exponent only', () => {
    expect(parseStrictNumber('1.5')).toBe(1.5);
    expect(parseStrictNumber(' -2e-3 ')).toBe(-0.002);
    expect(parseStrictNumber('.5')).toBe(0.5);
    for (const text of [
      '1,5',
      'nan',
      'NaN',
      'inf',
      'Infinity',
      '1e400',
      '',
      'abc',
      '0x10',
      '1.2.3',
    ]) {
      expect(parseStrictNumber(text)).toBeUndefined();
    }
  });
});

describe('WarningCollector', () => {
  it('keeps each code and message once, in order', () => {
    const sink = new WarningCollector();
    sink.warn('a', 'x');
    sink.warn('b', 'y');
    sink.warn('a', 'x');
    expect(sink.list()).toEqual([
      { code: 'a', message: 'x' },
      { code: 'b', message: 'y' },
    ]);
  });
});
