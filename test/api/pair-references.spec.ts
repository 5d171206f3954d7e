/**
 * Potentials typed against their own reference electrode: a pair saved with E_ox vs SCE and
 * E_red vs Fc⁺/Fc in MeCN reloads with those references, stores the values on the SHE scale the
 * core's `drivingForce.reference` gives, and its driving force is the one `drivingForce.rehmWeller`
 * computes from the typed potentials with their references; E₀₀ keeps the nm it was typed in.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Pair, PairParameter } from '@gapwise/contracts';
import { registerUser, startTestApp, type Session, type TestApp } from './support/test-app';

let t: TestApp;
let owner: Session;
let wid: string;

beforeAll(async () => {
  t = await startTestApp();
  owner = await registerUser(t.app, 'owner');
  wid = (await owner.post('/api/workspaces', { name: 'References' }).expect(201)).body.id;
});
afterAll(async () => t?.close());

// Published offsets vs SHE: SCE +0.241 V (Bard & Faulkner, Electrochemical Methods, 2nd ed.,
// from memory); Fc⁺/Fc in MeCN +0.380 V vs SCE (Pavlishchuk & Addison, Inorg. Chim. Acta 2000,
// 298, 97, from memory), so +0.621 V vs SHE.
const EOX_VS_SCE = 1.1;
const ERED_VS_FC = -0.4;
const EOX_SHE = EOX_VS_SCE + 0.241;
const ERED_SHE = ERED_VS_FC + 0.621;
// E₀₀ from 450 nm: 1239.84198/450 eV (hc/e, CODATA 2018; SCIENCE.md §4).
const E00_EV = 1239.84198 / 450;
// Rehm–Weller with neutral D and A in MeCN (ε = 35.94) at R = 7 Å: w(D⁺A⁻) = −14.39965/(εR) eV.
const DELTA_G_CS = EOX_SHE - ERED_SHE - E00_EV - 14.39965 / (35.94 * 7);

const param = (
  kind: PairParameter['kind'],
  value: number,
  unit: string,
  provenance: PairParameter['provenance'] = { kind: 'measured' },
): PairParameter => ({ kind, value, unit, uncertainty: null, provenance });

describe('potentials typed against a reference electrode', () => {
  it('reloads E_ox vs SCE and E_red vs Fc⁺/Fc in MeCN, and gives the core’s driving force', async () => {
    // The driving force as the pair editor's Rehm–Weller helper asks the core for it.
    const typedInputs = {
      donorOxidation: { value: EOX_VS_SCE, unit: 'V', reference: 'SCE' },
      acceptorReduction: { value: ERED_VS_FC, unit: 'V', reference: 'Fc', solvent: 'MeCN' },
      excitationEnergy: { value: 450, unit: 'nm' },
      distance: 7,
      epsilon: 35.94,
    };
    const calc = await owner
      .post('/api/calc', { method: 'drivingForce.rehmWeller', inputs: typedInputs })
      .expect(200);
    expect(calc.body.outputs.deltaG0CS).toBeCloseTo(DELTA_G_CS, 6); // 14.39965 is e²/(4πε₀·1 Å) to 7 figures
    // Different references: the core says so.
    expect(calc.body.warnings.map((w: { code: string }) => w.code)).toContain(
      'reference-electrode',
    );

    const body = {
      name: 'Referenced potentials',
      donor: 'D',
      acceptor: 'A',
      medium: 'acetonitrile',
      temperature: 298.15,
      parameters: [
        param('deltaG0', calc.body.outputs.deltaG0CS, 'eV', {
          kind: 'derived',
          methodId: 'drivingForce.rehmWeller',
          methodInputs: typedInputs,
        }),
        param('lambdaOuter', 0.8, 'eV'),
        param('coupling', 0.01, 'eV'),
        param('donorOxidation', EOX_SHE, 'V vs SCE'),
        param('acceptorReduction', ERED_SHE, 'V vs Fc in MeCN'),
        param('excitationEnergy', E00_EV, 'nm'),
      ],
    };
    const created = (await owner.post(`/api/workspaces/${wid}/pairs`, body).expect(201))
      .body as Pair;
    const reloaded = (await owner.get(`/api/pairs/${created.id}`).expect(200)).body as Pair;
    const byKind = (kind: string) => reloaded.parameters.find((p) => p.kind === kind)!;
    expect(byKind('donorOxidation')).toMatchObject({ unit: 'V vs SCE', value: EOX_SHE });
    expect(byKind('acceptorReduction')).toMatchObject({
      unit: 'V vs Fc in MeCN',
      value: ERED_SHE,
    });
    expect(byKind('excitationEnergy')).toMatchObject({ unit: 'nm', value: E00_EV });
    expect(byKind('deltaG0').value).toBeCloseTo(DELTA_G_CS, 6);

    // The stored SHE values are what the core's drivingForce.reference gives for the typed ones.
    const toShe = async (potential: number, from: string, solvent?: string) =>
      (
        await owner
          .post('/api/calc', {
            method: 'drivingForce.reference',
            inputs: { potential, from, to: 'SHE', ...(solvent ? { fromSolvent: solvent } : {}) },
          })
          .expect(200)
      ).body.outputs.potential as number;
    expect(await toShe(EOX_VS_SCE, 'SCE')).toBeCloseTo(byKind('donorOxidation').value, 12);
    // Same driving force from the stored (SHE) potentials without references.
    const fromStored = await owner
      .post('/api/calc', {
        method: 'drivingForce.rehmWeller',
        inputs: {
          donorOxidation: byKind('donorOxidation').value,
          acceptorReduction: byKind('acceptorReduction').value,
          excitationEnergy: byKind('excitationEnergy').value,
          distance: 7,
          epsilon: 35.94,
        },
      })
      .expect(200);
    // To 1e-6 eV: the test's E₀₀ used hc/e = 1239.84198 eV nm, the core CODATA's full value.
    expect(fromStored.body.outputs.deltaG0CS).toBeCloseTo(byKind('deltaG0').value, 6);
  });

  it('refuses an unknown reference electrode in the unit, naming the field', async () => {
    const res = await owner
      .post(`/api/workspaces/${wid}/pairs`, {
        name: 'Bad reference',
        donor: 'D',
        acceptor: 'A',
        medium: '',
        temperature: 298.15,
        parameters: [param('donorOxidation', 1, 'V vs calomel')],
      })
      .expect(400);
    const fields = res.body.error.fields as Array<{ field: string; message: string }>;
    expect(fields.find((f) => f.field === 'parameters.0.unit')?.message).toMatch(
      /unknown reference electrode.*SCE/,
    );
  });
});
