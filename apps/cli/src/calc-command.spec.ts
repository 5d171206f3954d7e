import { spawn } from 'node:child_process';
import { createInterface } from 'node:readline';
import { Readable, Writable } from 'node:stream';
import { fileURLToPath } from 'node:url';
import { calculate, methodCatalog, serializeAnswer } from '@gapwise/calc';
import { describe, expect, it } from 'vitest';
import { answerText, runBatch } from './calc-command';

const BIN = fileURLToPath(new URL('../bin/gapwise.js', import.meta.url));
const SLOW = 120_000;

interface Run {
  readonly code: number | null;
  readonly stdout: string;
  readonly stderr: string;
}

/** Spawns `node apps/cli/bin/gapwise.js <args>` with `input` on standard input. */
function gapwise(args: string[], input: string): Promise<Run> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [BIN, ...args], { stdio: ['pipe', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (chunk: string) => (stdout += chunk));
    child.stderr.setEncoding('utf8').on('data', (chunk: string) => (stderr += chunk));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code, stdout, stderr }));
    child.stdin.end(input);
  });
}

const marcus = {
  method: 'rate.marcus',
  inputs: { deltaG0: -0.3, lambda: 0.8, coupling: 0.01, temperature: 298.15 },
};

describe('gapwise calc', () => {
  it(
    'answers one request byte-identically to serializeAnswer(calculate(request)), exit 0',
    async () => {
      const run = await gapwise(['calc'], JSON.stringify(marcus));
      expect(run.stdout).toBe(`${serializeAnswer(calculate(marcus))}\n`);
      expect(run.code).toBe(0);
      // SCIENCE.md §1 worked example: k ≈ 8.978e10 s⁻¹.
      expect(JSON.parse(run.stdout).outputs.k).toBeCloseTo(8.978e10, -8);
    },
    SLOW,
  );

  it(
    'exits 2 for a refused request and for invalid JSON (field request)',
    async () => {
      const refused = { method: 'rate.marcus', inputs: { ...marcus.inputs, lambda: -1 } };
      const run = await gapwise(['calc'], JSON.stringify(refused));
      expect(run.stdout).toBe(`${serializeAnswer(calculate(refused))}\n`);
      expect(run.code).toBe(2);
      const invalid = await gapwise(['calc'], '{"method": ');
      expect(JSON.parse(invalid.stdout)).toMatchObject({
        ok: false,
        errors: [{ field: 'request' }],
      });
      expect(invalid.code).toBe(2);
    },
    SLOW,
  );

  it(
    'streams --batch: one answer per line in order, a bad line answered on its own, exit 2',
    async () => {
      const requests: unknown[] = [
        marcus,
        { method: 'units.convert', inputs: { value: 1, from: 'hartree', to: 'eV' } },
        { method: 'rate.unknown', inputs: {} },
        { method: 'rate.ruler', inputs: { distance: 10, deltaG0: -0.5, lambda: 0.7 } },
      ];
      const lines = [
        JSON.stringify(requests[0]),
        JSON.stringify(requests[1]),
        'not json',
        JSON.stringify(requests[2]),
        JSON.stringify(requests[3]),
      ];
      const run = await gapwise(['calc', '--batch'], `${lines.join('\n')}\n`);
      const out = run.stdout.split('\n');
      expect(out.pop()).toBe('');
      expect(out).toHaveLength(5);
      expect(out[0]).toBe(serializeAnswer(calculate(requests[0])));
      expect(out[1]).toBe(serializeAnswer(calculate(requests[1])));
      expect(JSON.parse(out[2])).toMatchObject({ ok: false, errors: [{ field: 'request' }] });
      expect(out[3]).toBe(serializeAnswer(calculate(requests[2])));
      expect(out[4]).toBe(serializeAnswer(calculate(requests[3])));
      expect(run.code).toBe(2);
      const allGood = await gapwise(
        ['calc', '--batch'],
        `${JSON.stringify(marcus)}\r\n${JSON.stringify(marcus)}\r\n`,
      );
      expect(allGood.stdout.trim().split('\n')).toHaveLength(2);
      expect(allGood.code).toBe(0);
    },
    SLOW,
  );

  it(
    '--help lists every registered method with its inputs and units; bad options exit 1',
    async () => {
      const run = await gapwise(['calc', '--help'], '');
      expect(run.code).toBe(0);
      for (const method of methodCatalog()) {
        expect(run.stdout).toContain(`  ${method.id}\n`);
        for (const input of method.inputs) expect(run.stdout).toContain(input.name);
        for (const reference of method.references) expect(run.stdout).toContain(reference);
      }
      // The methods of issue 13, each with its published source.
      expect(run.stdout).toMatch(
        / {2}rate\.mljThermal\n[\s\S]*?J\. Jortner, J\. Chem\. Phys\. 1976/,
      );
      expect(run.stdout).toMatch(/ {2}rate\.landauZener\n[\s\S]*?Newton, N\. Sutin/);
      expect(run.stdout).toMatch(/ {2}evb\.adiabaticBarrier\n[\s\S]*?Brunschwig, N\. Sutin/);
      expect(run.stdout).toContain('kcal/mol');
      const bad = await gapwise(['calc', '--frobnicate'], '');
      expect(bad.code).toBe(1);
      const unknownCommand = await gapwise(['nope'], '');
      expect(unknownCommand.code).toBe(1);
    },
    SLOW,
  );

  it(
    'answers the second-wave methods (reference electrodes, nm, Stern–Volmer, k(T) fits, work terms, absolute MHC, normal modes) as calculate() does',
    async () => {
      const requests = [
        {
          method: 'drivingForce.reference',
          inputs: { potential: 0.35, from: 'Fc', fromSolvent: 'MeCN', to: 'SCE' },
        },
        {
          method: 'drivingForce.rehmWeller',
          inputs: {
            donorOxidation: { value: 1.2, unit: 'V', reference: 'SCE' },
            acceptorReduction: { value: -1.18, unit: 'V', reference: 'Fc', solvent: 'MeCN' },
            excitationEnergy: { value: 496, unit: 'nm' },
            distance: 7,
            epsilon: 35.94,
          },
        },
        {
          method: 'quench.sternVolmer',
          inputs: { lifetime: 6e-7, kq: 2e9, concentration: 1e-3 },
        },
        {
          method: 'analysis.temperature',
          inputs: {
            points: [
              { temperature: 280, k: 2e6 },
              { temperature: 300, k: 6e6 },
              { temperature: 320, k: 1.6e7 },
            ],
            lambda: 0.8,
            deltaG0: -0.3,
          },
        },
        {
          method: 'rate.crossRelationWork',
          inputs: {
            k11: 4.2,
            k22: 3.3e6,
            K12: 1.2e4,
            temperature: 298.15,
            charge1: 2,
            charge2: 3,
            productCharge1: 3,
            productCharge2: 2,
            radius1: 3.4,
            radius2: 6.8,
            epsilon: 78.4,
            ionicStrength: 0.1,
          },
        },
        {
          method: 'electrode.mhcAbsolute',
          inputs: {
            lambda: 0.3,
            overpotential: -0.1,
            temperature: 298.15,
            coupling: 0.001,
            densityOfStates: 0.3,
          },
        },
        {
          method: 'reorg.normalModes',
          inputs: { modes: [{ hbarOmega: { value: 1600, unit: 'cm-1' }, huangRhys: 0.4 }] },
        },
      ];
      const run = await gapwise(
        ['calc', '--batch'],
        requests.map((r) => JSON.stringify(r)).join('\n') + '\n',
      );
      const out = run.stdout.trim().split('\n');
      expect(out).toHaveLength(requests.length);
      for (const [i, request] of requests.entries()) {
        expect(out[i]).toBe(serializeAnswer(calculate(request)));
        expect(JSON.parse(out[i]!).ok).toBe(true);
      }
      expect(run.code).toBe(0);
      // Mixed references are converted and flagged (VALIDATION.md B15).
      expect(JSON.parse(out[1]!).warnings.map((w: { code: string }) => w.code)).toContain(
        'reference-electrode',
      );
      const help = await gapwise(['calc', '--help'], '');
      for (const id of requests.map((r) => r.method)) expect(help.stdout).toContain(`  ${id}\n`);
      expect(help.stdout).toContain('nm');
    },
    SLOW,
  );
});

describe('runBatch line ends', () => {
  /** Answers `chunks` fed one by one, as a pipe delivers them. */
  async function batch(chunks: Array<string | Buffer>): Promise<string[]> {
    let out = '';
    const sink = new Writable({
      write(chunk: Buffer, _enc, done) {
        out += chunk.toString('utf8');
        done();
      },
    });
    await runBatch(Readable.from(chunks, { objectMode: false }), sink);
    return out.split('\n').slice(0, -1);
  }
  /** What node:readline (crlfDelay ∞) calls the lines of the same text: the reference. */
  async function readlineLines(text: string): Promise<string[]> {
    const lines: string[] = [];
    for await (const line of createInterface({
      input: Readable.from([text]),
      crlfDelay: Number.POSITIVE_INFINITY,
    }))
      lines.push(line);
    return lines;
  }
  const line = JSON.stringify(marcus);

  it('splits lines as readline does: LF, CRLF (also across chunks), lone CR, no final LF', async () => {
    const cases: string[][] = [
      [`${line}\n${line}\n`],
      [`${line}\r\n${line}\r`, `\n${line}`],
      [`${line}\r${line}\n\n`, `${line}`],
      [`${line.slice(0, 20)}`, `${line.slice(20)}\n`, `\r\n`],
    ];
    for (const chunks of cases) {
      const expected = (await readlineLines(chunks.join(''))).map((l) =>
        serializeAnswer(answerText(l)),
      );
      expect(await batch(chunks)).toEqual(expected);
    }
  });

  it('keeps a UTF-8 character split between chunks whole', async () => {
    const text = Buffer.from(`{"method":"rate.marcus","inputs":{"deltaG0":-0.3,"note":"λ"}}\n`);
    const at = text.indexOf(Buffer.from('λ')) + 1;
    const [answer] = await batch([text.subarray(0, at), text.subarray(at)]);
    expect(answer).toBe(serializeAnswer(answerText(text.toString('utf8').trim())));
  });
});
