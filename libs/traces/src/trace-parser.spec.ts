import { gzipSync } from 'node:zlib';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { NOT_A_NUMBER, readStrictNumber } from './trace-number';
import { type TraceParseSettings } from './trace-parser';
import { readTrace, traceProblems } from './trace-stream';

/** Parses a whole text (or bytes) fed in chunks of `chunkSize` bytes; collects the values. */
async function parse(
  text: string | Buffer,
  settings: Partial<TraceParseSettings> = {},
  chunkSize = 1 << 16,
) {
  const bytes = typeof text === 'string' ? Buffer.from(text, 'utf8') : text;
  const values: number[] = [];
  async function* chunks() {
    for (let i = 0; i < bytes.length; i += chunkSize) yield bytes.subarray(i, i + chunkSize);
  }
  const result = await readTrace(chunks(), { unit: 'eV', ...settings }, (v, n) => {
    for (let i = 0; i < n; i++) values.push(v[i]);
  });
  return {
    ...result,
    values,
    problems: traceProblems(result.summary, settings.skipBadLines ?? false),
  };
}

const num = (s: string) => {
  const b = Buffer.from(s, 'latin1');
  return readStrictNumber(b, 0, b.length);
};

describe('strict number reading', () => {
  it('agrees bit for bit with the platform reader on every text the grammar accepts', () => {
    // Expected values: JavaScript's own Number(), an independent correctly rounded reader.
    const digits = fc.stringMatching(/^[0-9]{1,22}$/);
    const text = fc
      .tuple(
        fc.constantFrom('', '+', '-'),
        digits,
        fc.option(fc.stringMatching(/^[0-9]{0,20}$/)),
        fc.option(
          fc.tuple(
            fc.constantFrom('e', 'E'),
            fc.constantFrom('', '+', '-'),
            fc.integer({ min: 0, max: 400 }),
          ),
        ),
      )
      .map(
        ([sign, int, frac, exp]) =>
          `${sign}${int}${frac === null ? '' : `.${frac}`}${exp === null ? '' : `${exp[0]}${exp[1]}${exp[2]}`}`,
      );
    fc.assert(
      fc.property(text, (t) => {
        expect(Object.is(num(t), Number(t))).toBe(true);
      }),
      { numRuns: 20_000, seed: 6 },
    );
  });

  it('reads the forms a trace file uses', () => {
    expect(num('0.25')).toBe(0.25);
    expect(num('-1.5e-3')).toBe(-0.0015);
    expect(num('.5')).toBe(0.5);
    expect(num('5.')).toBe(5);
    expect(num('+7E2')).toBe(700);
    expect(num('1e400')).toBe(Infinity);
    expect(num('1e-400')).toBe(0);
  });

  it.each([
    '',
    '.',
    '-',
    'abc',
    '1,5',
    '0x10',
    '1e',
    '1e+',
    '1_000',
    'nan',
    'NaN',
    'inf',
    'Infinity',
    '1.2.3',
    '--1',
    '1 2',
  ])('refuses %j', (t) => {
    expect(num(t)).toBe(NOT_A_NUMBER);
  });
});

describe('trace file parsing', () => {
  it('reads a CSV with a header, comments and CRLF line ends; the last column by default', async () => {
    const r = await parse(
      '# made by a seeded generator\r\nframe,dE\r\n1,0.5\r\n2,0.25\r\n# note\r\n3,-1e-1\r\n',
    );
    expect(r.problems).toEqual([]);
    expect(r.values).toEqual([0.5, 0.25, -0.1]);
    expect(r.summary).toMatchObject({
      delimiter: 'comma',
      header: ['frame', 'dE'],
      columnIndex: 2,
      columnName: 'dE',
      sampleCount: 3,
      lineCount: 6,
    });
    expect(r.summary.meanEv).toBeCloseTo((0.5 + 0.25 - 0.1) / 3, 15);
  });

  it('gives the same values whatever the chunk boundaries (one byte at a time)', async () => {
    const text = '\ufeffframe\tdE\n1\t0.5\r\n2\t0.25\n3\t0.125';
    const whole = await parse(text);
    const bytewise = await parse(text, {}, 1);
    expect(whole.values).toEqual([0.5, 0.25, 0.125]);
    expect(bytewise.values).toEqual(whole.values);
    expect(bytewise.summary.delimiter).toBe('tab');
  });

  it('chooses the column by name or 1-based index, in whitespace-separated files', async () => {
    const text = 't  eR   dE\n0  1.0  0.5\n1  2.0  0.75\n';
    expect((await parse(text, { column: 'eR' })).values).toEqual([1, 2]);
    expect((await parse(text, { column: 'DE' })).values).toEqual([0.5, 0.75]);
    expect((await parse(text, { column: 1 })).values).toEqual([0, 1]);
    expect((await parse(text)).summary.delimiter).toBe('whitespace');
  });

  it('refuses an unknown column name, an index past the end, and a name without a header', async () => {
    expect((await parse('a,b\n1,2\n', { column: 'dE' })).problems).toEqual([
      { field: 'column', message: "Column 'dE' is not in the header (a,b)." },
    ]);
    expect((await parse('a,b\n1,2\n', { column: 3 })).problems[0].field).toBe('column');
    expect((await parse('1,2\n', { column: 'dE' })).problems[0].message).toMatch(/no header row/);
  });

  it('converts kcal/mol, kJ/mol, hartree and cm-1 to eV with the core units module', async () => {
    // Expected factors: CODATA 2018 (1 eV = 23.060548 kcal/mol = 96.485332 kJ/mol =
    // 8065.5440 cm-1; 1 hartree = 27.211386 eV), independent of the code under test.
    expect((await parse('23.060547830619\n', { unit: 'kcal/mol' })).values[0]).toBeCloseTo(1, 9);
    expect((await parse('96.485332123\n', { unit: 'kJ/mol' })).values[0]).toBeCloseTo(1, 9);
    expect((await parse('8065.543937\n', { unit: 'cm-1' })).values[0]).toBeCloseTo(1, 9);
    expect((await parse('1\n', { unit: 'hartree' })).values[0]).toBeCloseTo(27.211386245988, 9);
  });

  it('reads a gzip-compressed file, detected by its magic bytes', async () => {
    const text =
      'dE\n' + Array.from({ length: 1000 }, (_, i) => `${(i / 1000).toFixed(3)}`).join('\n') + '\n';
    const r = await parse(gzipSync(Buffer.from(text)), {}, 777);
    expect(r.gzip).toBe(true);
    expect(r.values).toHaveLength(1000);
    expect(r.values[999]).toBe(0.999);
    expect(r.rawBytes).toBeLessThan(text.length);
  });

  it('refuses corrupt gzip data', async () => {
    const gz = gzipSync(Buffer.from('dE\n1\n2\n'));
    const broken = Buffer.concat([gz.subarray(0, 12), Buffer.from('garbage-garbage-garbage')]);
    await expect(parse(broken)).rejects.toThrow(/cannot be decompressed/);
  });

  it('lists each kind of bad line with its line number', async () => {
    const text = [
      'frame,dE', // 1
      '1,0.5', // 2
      '2,abc', // 3 not a number
      '3,', // 4 empty
      '4,nan', // 5 non-finite word
      '5,1e400', // 6 overflows
      '6,0.1,7', // 7 wrong column count
      'frame,dE', // 8 second header
      '7,0,5', // 9 locale comma -> three columns
      '8,inf', // 10
      '9,0.2', // 11
    ].join('\n');
    const r = await parse(text);
    expect(r.summary.badLines.count).toBe(8);
    expect(r.problems.map((p) => p.message)).toEqual([
      "Line 3: 'abc' is not a number.",
      'Line 4: empty value in column 2.',
      'Line 5: non-finite value.',
      'Line 6: non-finite value.',
      'Line 7: expected 2 columns (frame,dE), found 3.',
      'Line 8: a second header row in the middle of the data.',
      'Line 9: expected 2 columns (frame,dE), found 3.',
      'Line 10: non-finite value.',
      '8 bad lines in total.',
    ]);
    expect(r.problems.slice(0, 8).map((p) => p.line)).toEqual([3, 4, 5, 6, 7, 8, 9, 10]);
  });

  it('lists the first 20 bad lines and the total count', async () => {
    const lines = ['dE'];
    for (let i = 0; i < 100; i++) lines.push(i % 2 === 0 ? `${i}` : 'x');
    const r = await parse(lines.join('\n'));
    expect(r.summary.badLines.count).toBe(50);
    expect(r.summary.badLines.first.map((b) => b.line)).toEqual(
      Array.from({ length: 20 }, (_, k) => 3 + 2 * k),
    );
    expect(r.problems.at(-1)?.message).toBe('50 bad lines in total (the first 20 are listed).');
  });

  it('skips bad lines on request and records how many', async () => {
    const r = await parse('dE\n1\nfoo\n2\n\n3\nnan\n', { skipBadLines: true });
    expect(r.problems).toEqual([]);
    expect(r.values).toEqual([1, 2, 3]);
    expect(r.summary.badLines.count).toBe(2);
    expect(r.summary.badLines.first.map((b) => b.line)).toEqual([3, 7]);
  });

  it('refuses a header-only file, an empty file and a file of comments', async () => {
    for (const text of ['frame,dE\n', '', '# nothing\n\n']) {
      expect((await parse(text)).problems).toEqual([
        { field: 'file', message: 'No data rows found.' },
      ]);
    }
  });

  it('refuses a line longer than any trace row (a binary file)', async () => {
    const r = await parse(Buffer.alloc(3 << 20, 0x41));
    expect(r.problems[0].message).toMatch(/longer than/);
  });

  it('refuses an unknown unit and a zero column index before reading', async () => {
    await expect(parse('1\n', { unit: 'kcal' as never })).rejects.toThrow(
      /Unrecognised unit 'kcal'/,
    );
    await expect(parse('1\n', { column: 0 })).rejects.toThrow(/Column index/);
  });
});
