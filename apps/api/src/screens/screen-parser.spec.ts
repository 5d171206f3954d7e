import { describe, expect, it } from 'vitest';
import { Readable } from 'node:stream';
import {
  decodeInputChunk,
  encodeInputChunk,
  parseScreenCsv,
  type InputChunk,
} from './screen-parser';
import { templateCsv } from './screen-columns';

const HEADER =
  'donor,acceptor,donorOxidation [V],acceptorReduction [mV],excitationEnergy [eV],distance [nm],' +
  'radiusDonor [A],radiusAcceptor [A],solvent,lambdaInner [kcal/mol],coupling [cm-1],temperature [degC]';

async function parseAll(text: string, chunkSize = 2) {
  const chunks: InputChunk[] = [];
  const summary = await parseScreenCsv(Readable.from([text]), {
    chunkSize,
    onChunk: (c) => {
      chunks.push(c);
    },
  });
  return { summary, chunks };
}

describe('screen CSV parser', () => {
  it('reads the template and converts header units to canonical units', async () => {
    const { summary, chunks } = await parseAll(templateCsv());
    expect(summary.fatal).toBe(false);
    expect(summary.goodRows).toBe(1);
    expect(chunks[0].donor).toEqual(['Med-1']);
    // acetonitrile from the built-in table
    expect(chunks[0].values.epsilon[0]).toBe(35.94);
  });

  it('converts mV, nm, kcal/mol and degC (factors: SCIENCE.md §16, 1 eV = 23.06054783 kcal/mol)', async () => {
    const text = `${HEADER}\nD-1,A-1,1.0,-1000,2.5,0.7,3.5,3.5,acetonitrile,2.306054783,80,25\n`;
    const { summary, chunks } = await parseAll(text);
    expect(summary.badRowCount).toBe(0);
    const v = chunks[0].values;
    expect(v.acceptorReduction[0]).toBeCloseTo(-1.0, 12);
    expect(v.distance[0]).toBeCloseTo(7.0, 12);
    expect(v.lambdaInner[0]).toBeCloseTo(0.1, 10);
    expect(v.temperature[0]).toBeCloseTo(298.15, 10);
    expect(v.coupling[0]).toBeCloseTo(80 / 8065.543937, 12);
  });

  it('lists every bad row with its line number and keeps the good ones', async () => {
    const rows = [
      'D-1,A-1,1.0,-1000,2.5,0.7,3.5,3.5,acetonitrile,2.3,80,25', // line 2 good
      'D-2,A-2,abc,-1000,2.5,0.7,3.5,3.5,acetonitrile,2.3,80,25', // line 3 not a number
      'D-3,A-3,1.0,-1000,2.5,0.7,3.5,3.5,acetonitrile,2.3,80', // line 4 wrong column count
      'D-4,A-4,1.0,-1000,2.5,0.7,3.5,3.5,acetonitrile,2.3,80,-300', // line 5 T < 0 K
      'D-5,A-5,1.0,-1000,2.5,0.5,3.5,3.5,acetonitrile,2.3,80,25', // line 6 spheres overlap (R = 5 Å)
      'D-6,A-6,1.0,-1000,nan,0.7,3.5,3.5,acetonitrile,2.3,80,25', // line 7 non-finite
      'D-7,A-7,1.0,-1000,1e400,0.7,3.5,3.5,acetonitrile,2.3,80,25', // line 8 non-finite
      'D-8,A-8,1.0,-1000,2.5,0.7,3.5,3.5,unobtainium,2.3,80,25', // line 9 unknown solvent
      'D-9,A-9,"1,0",-1000,2.5,0.7,3.5,3.5,acetonitrile,2.3,80,25', // line 10 locale comma
    ];
    const { summary } = await parseAll(`${HEADER}\n${rows.join('\n')}\n`);
    expect(summary.goodRows).toBe(1);
    expect(summary.badRowCount).toBe(8);
    expect(summary.badRows.map((b) => b.line)).toEqual([3, 4, 5, 6, 7, 8, 9, 10]);
    expect(summary.badRows[0].message).toMatch(/^Line 3: 'donorOxidation': 'abc' is not a number/);
    expect(summary.badRows[1].message).toMatch(/expected 12 columns/);
    expect(summary.badRows[2].message).toMatch(/Did you enter °C/);
    expect(summary.badRows[3].message).toMatch(/≥ a_D \+ a_A/);
    expect(summary.badRows[4].message).toMatch(/non-finite/);
    expect(summary.badRows[5].message).toMatch(/non-finite/);
  });

  it('refuses unknown columns, refused units and missing required columns on line 1', async () => {
    const { summary } = await parseAll('donor,acceptor,lambdaInner [kcal],colour\nx,y,1,2\n');
    expect(summary.fatal).toBe(true);
    const text = summary.badRows.map((b) => b.message).join('\n');
    expect(text).toMatch(/Unrecognised unit 'kcal'/);
    expect(text).toMatch(/unknown column 'colour'/);
    expect(text).toMatch(/missing required column 'donorOxidation'/);
  });

  it('refuses a file without data rows', async () => {
    const { summary } = await parseAll(`${HEADER}\n`);
    expect(summary.fatal).toBe(true);
    expect(summary.badRows[0].message).toMatch(/No data rows found/);
  });

  it('lists only the first 20 bad rows but counts all', async () => {
    const bad = Array.from(
      { length: 30 },
      () => 'D,A,x,-1000,2.5,0.7,3.5,3.5,acetonitrile,2.3,80,25',
    );
    const { summary } = await parseAll(`${HEADER}\n${bad.join('\n')}\n`);
    expect(summary.badRowCount).toBe(30);
    expect(summary.badRows).toHaveLength(20);
  });

  it('chunks rows and round-trips the compact storage form; equal inputs hash equally', async () => {
    const row = 'D-1,A-1,1.0,-1000,2.5,0.7,3.5,3.5,acetonitrile,2.3,80,25';
    const text = `${HEADER}\n${[row, row, row, row, row].join('\n')}\n`;
    const a = await parseAll(text, 2);
    const b = await parseAll(text.replace(/\n/g, '\r\n'), 2);
    expect(a.chunks.map((c) => c.lines)).toEqual([[2, 3], [4, 5], [6]]);
    expect(a.summary.inputHash).toBe(b.summary.inputHash);
    const back = decodeInputChunk(1, encodeInputChunk(a.chunks[1]));
    expect(back.lines).toEqual([4, 5]);
    expect(Array.from(back.values.distance)).toEqual(Array.from(a.chunks[1].values.distance));
    expect(Number.isNaN(back.values.lambdaOuter[0])).toBe(true);
  });

  it('numbers lines as an editor shows them: BOM, CRLF, empty lines, quoted cells with line breaks, split pieces', async () => {
    const good = (name: string) => `${name},A-1,1.0,-1000,2.5,0.7,3.5,3.5,acetonitrile,2.3,80,25`;
    const text = [
      `\ufeff${HEADER}`, // line 1, with a byte-order mark
      good('D-1'), // line 2
      '', // line 3: empty, skipped
      good('"D-2\r\nsecond line of the name"'), // lines 4–5: one record
      good('D-3').replace('2.5', 'abc'), // line 6: bad
      good('"D-""4"""'), // line 7: escaped quotes
      '',
    ].join('\r\n');
    // Delivered in 7-character pieces, so records and quoted cells straddle piece boundaries.
    const pieces = Array.from({ length: Math.ceil(text.length / 7) }, (_, i) =>
      text.slice(i * 7, i * 7 + 7),
    );
    const chunks: InputChunk[] = [];
    const summary = await parseScreenCsv(Readable.from(pieces), {
      chunkSize: 10,
      onChunk: (c) => void chunks.push(c),
    });
    expect(summary.fatal).toBe(false);
    expect(chunks[0].lines).toEqual([2, 4, 7]);
    expect(chunks[0].donor).toEqual(['D-1', 'D-2\r\nsecond line of the name', 'D-"4"']);
    expect(summary.badRows.map((b) => b.line)).toEqual([6]);
  });

  it('stops at a quote left open for more than 1 MB, naming its line, instead of reading on', async () => {
    const good = `D-1,A-1,1.0,-1000,2.5,0.7,3.5,3.5,acetonitrile,2.3,80,25`;
    const open = `"D-2,A-2,${'x'.repeat(1024)}`;
    // The open quote swallows every later line: more than MAX_RECORD_CHARS in all.
    const pieces = [`${HEADER}\n${good}\n${open}\n`];
    for (let i = 0; i < 1100; i++) pieces.push(`${'y'.repeat(1023)}\n`);
    const summary = await parseScreenCsv(Readable.from(pieces), { chunkSize: 10 });
    expect(summary.fatal).toBe(true);
    expect(summary.badRows.map((b) => b.line)).toEqual([3]);
    expect(summary.badRows[0].message).toMatch(/longer than 1 MB \(is a quote left open\?\)/);
  });
});
