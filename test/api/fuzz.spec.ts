import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PARAMETER_KINDS, PROVENANCE_KINDS } from '@gapwise/contracts';
import { pairBody } from './support/fixtures';
import { registerUser, startTestApp, type Session, type TestApp } from './support/test-app';

let t: TestApp;
let s: Session;
let wid: string;
let pairId: string;

beforeAll(async () => {
  t = await startTestApp();
  s = await registerUser(t.app, 'fuzzer');
  wid = (await s.post('/api/workspaces', { name: 'Fuzz' }).expect(201)).body.id;
  pairId = (await s.post(`/api/workspaces/${wid}/pairs`, pairBody()).expect(201)).body.id;
});
afterAll(async () => t?.close());

const nasty = fc.oneof(
  fc.string(),
  fc.string({ unit: 'binary' }),
  fc.constantFrom(
    '\u0000',
    '\ud800',
    'x\udc00',
    '',
    ' ',
    'eV',
    'kcal/mol',
    'cm-1',
    'degC',
    'K',
    'A',
    '__proto__',
    'constructor',
  ),
  fc.double(),
  fc.integer(),
  fc.constantFrom(1e308, -1e308, 2 ** 31, 2 ** 53, -0, 0.5),
  fc.boolean(),
  fc.constant(null),
);
const anyJson = fc.oneof(
  nasty,
  fc.array(nasty, { maxLength: 4 }),
  fc.dictionary(fc.string({ maxLength: 8 }), nasty, { maxKeys: 4 }),
);

/** Parameters that are sometimes right and sometimes subtly wrong. */
const parameter = fc.record(
  {
    kind: fc.oneof(fc.constantFrom(...Object.keys(PARAMETER_KINDS)), nasty),
    value: fc.oneof(fc.double({ noNaN: true, noDefaultInfinity: true }), nasty),
    unit: fc.oneof(fc.constantFrom('eV', 'kcal/mol', 'cm-1', 'A', 'nm', 'V', 'ps', ''), nasty),
    uncertainty: fc.oneof(
      fc.constant(null),
      fc.double({ noNaN: true, noDefaultInfinity: true }),
      nasty,
    ),
    provenance: fc.oneof(
      fc.record(
        {
          kind: fc.oneof(fc.constantFrom(...PROVENANCE_KINDS), nasty),
          citation: nasty,
          methodId: nasty,
          methodInputs: anyJson,
          sources: fc.oneof(
            fc.array(fc.record({ type: nasty, id: nasty }), { maxLength: 3 }),
            nasty,
          ),
          note: nasty,
        },
        { requiredKeys: ['kind'] },
      ),
      nasty,
    ),
    extra: nasty,
  },
  { requiredKeys: [] },
);

const pairLike = fc.record(
  {
    name: nasty,
    donor: nasty,
    acceptor: nasty,
    medium: nasty,
    temperature: fc.oneof(fc.double({ min: -10, max: 20000, noNaN: true }), nasty),
    temperatureUnit: nasty,
    notes: nasty,
    status: fc.oneof(fc.constantFrom('draft', 'active', 'archived'), nasty),
    tags: fc.oneof(fc.array(nasty, { maxLength: 5 }), nasty),
    model: fc.oneof(fc.constantFrom('marcus', 'mlj', 'crossover'), nasty),
    parameters: fc.oneof(fc.array(parameter, { maxLength: 6 }), nasty),
    version: fc.oneof(fc.integer({ min: -2, max: 5 }), nasty),
    [`__proto__`]: anyJson,
  },
  { requiredKeys: [] },
);

/** Mutates a valid body in one place, so deep validation paths are reached too. */
const mutatedValid = fc
  .tuple(fc.constantFrom('name', 'temperature', 'parameters', 'tags', 'model', 'status'), anyJson)
  .map(([field, value]) => ({
    ...pairBody(),
    [field]: value,
  }));

const body = fc.oneof(anyJson, pairLike, mutatedValid);

async function tableCounts(): Promise<string> {
  const rows = await t.db.query(
    `SELECT (SELECT count(*) FROM pairs) p, (SELECT count(*) FROM pair_parameters) pp,
            (SELECT count(*) FROM pair_versions) v, (SELECT count(*) FROM audit_events) a,
            (SELECT count(*) FROM workspaces) w, (SELECT count(*) FROM api_tokens) k`,
  );
  return JSON.stringify(rows[0]);
}

/** Every successful save must leave a consistent pair: a version row per version, parameters intact. */
async function consistent(): Promise<void> {
  const broken = await t.db.query(
    `SELECT p.id FROM pairs p
      WHERE (SELECT count(*) FROM pair_versions v WHERE v.pair_id = p.id) <> p.version
         OR NOT EXISTS (SELECT 1 FROM pair_versions v WHERE v.pair_id = p.id AND v.version = p.version
                        AND jsonb_array_length(v.snapshot->'parameters') =
                            (SELECT count(*) FROM pair_parameters pp WHERE pp.pair_id = p.id))`,
  );
  expect(broken).toEqual([]);
}

/** Sends any JSON value as the body (numbers, strings and null included). */
const send = (method: string, path: string, b: unknown) =>
  s
    .call(method, path)
    .set('Content-Type', 'application/json')
    .send(JSON.stringify(b) ?? 'null');

describe('fuzz: random and malformed bodies against the write routes', () => {
  const targets: Array<{ name: string; run: (b: unknown) => Promise<{ status: number }> }> = [
    { name: 'POST pairs', run: (b) => send('post', `/api/workspaces/${wid}/pairs`, b) },
    { name: 'PUT pair', run: (b) => send('put', `/api/pairs/${pairId}`, b) },
    { name: 'PATCH pair', run: (b) => send('patch', `/api/pairs/${pairId}`, b) },
    { name: 'POST workspaces', run: (b) => send('post', '/api/workspaces', b) },
    { name: 'POST invitations', run: (b) => send('post', `/api/workspaces/${wid}/invitations`, b) },
    { name: 'POST tokens', run: (b) => send('post', '/api/tokens', b) },
    { name: 'POST calc', run: (b) => send('post', '/api/calc', b) },
  ];

  for (const target of targets) {
    it(`${target.name}: never a 5xx, and a refused body writes nothing`, async () => {
      const runs = target.name.includes('pair') ? 400 : 150;
      await fc.assert(
        fc.asyncProperty(body, async (b) => {
          const before = await tableCounts();
          const res = await target.run(b);
          if (res.status >= 500) throw new Error(`${res.status} for ${JSON.stringify(b)}`);
          if (res.status >= 400) expect(await tableCounts()).toBe(before);
        }),
        { numRuns: runs, seed: 20260401 },
      );
      await consistent();
    });
  }

  it('raw, non-JSON and oversized payloads never give a 5xx', async () => {
    await fc.assert(
      fc.asyncProperty(fc.string({ maxLength: 200 }), async (raw) => {
        const res = await s
          .post(`/api/workspaces/${wid}/pairs`)
          .set('Content-Type', 'application/json')
          .send(raw);
        expect(res.status).toBeLessThan(500);
      }),
      { numRuns: 200, seed: 7 },
    );
  });
});
