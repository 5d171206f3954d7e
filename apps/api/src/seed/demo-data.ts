import bcrypt from 'bcryptjs';
import type { DataSource, EntityManager } from 'typeorm';
import { MembershipEntity, PairEntity, WorkspaceEntity } from '@gapwise/db';
import { type PairInput, type PairParameter, type Provenance, type Role } from '@gapwise/contracts';

import { findUserByEmail, insertUser } from '../auth/user-repository';
import { createPairIn, resultsFor } from '../pairs/pair-use-case';
import { createWorkspaceIn } from '../workspaces/workspace-use-case';
import { upsertMembership } from '../workspaces/workspace-repository';

/**
 * The demo scenario (invented): a small photoredox lab studying dye–acceptor dyads, and a flow
 * battery group screening redox mediators. Every compound code, value and notebook reference
 * is made up; the values are only meant to be plausible.
 */
export const DEMO_PASSWORD = 'gapwise-demo';
export const DEMO_LAB = 'Halden Photoredox Lab';
export const DEMO_MEDIATORS = 'Tidewater Flow-Cell Mediator Screen';

export const DEMO_ACCOUNTS: ReadonlyArray<{ email: string; displayName: string; role: Role }> = [
  { email: 'owner@gapwise.test', displayName: 'Orla Brandt', role: 'owner' },
  { email: 'editor@gapwise.test', displayName: 'Emil Sandoval', role: 'editor' },
  { email: 'reviewer@gapwise.test', displayName: 'Rhea Lindqvist', role: 'reviewer' },
  { email: 'viewer@gapwise.test', displayName: 'Vik Adeyemi', role: 'viewer' },
];

const CM1_PER_EV = 8065.543937; // CODATA 2018, e/(hc) in cm⁻¹ per eV
const cm1 = (v: number) => v / CM1_PER_EV;

const measured = (note: string): Provenance => ({ kind: 'measured', note });
const literature = (citation: string, note?: string): Provenance => ({
  kind: 'literature',
  citation,
  note: note ?? null,
});
const computed = (note: string): Provenance => ({ kind: 'computed', note });
const assumed = (note: string): Provenance => ({ kind: 'assumed', note });
const derived = (
  methodId: string,
  methodInputs: Record<string, unknown>,
  sources: string[],
  note?: string,
): Provenance => ({
  kind: 'derived',
  methodId,
  methodInputs,
  sources: sources.map((id) => ({ type: 'parameter', id })),
  note: note ?? null,
});
const p = (
  kind: PairParameter['kind'],
  value: number,
  unit: string,
  uncertainty: number | null,
  provenance: Provenance,
): PairParameter => ({
  kind,
  value,
  unit,
  uncertainty,
  provenance,
});

/** Shared parameters of the dyads: acetonitrile, centre-to-centre geometry from models. */
function dyad(o: {
  name: string;
  donor: string;
  acceptor: string;
  eox: number;
  ered: number;
  e00: number;
  r: number;
  lambdaInner: number;
  lambdaInnerProv: Provenance;
  lambdaOuter: number;
  couplingCm1: number;
  couplingProv: Provenance;
  tags: string[];
  model?: PairInput['model'];
  extra?: PairParameter[];
  notes: string;
  status?: PairInput['status'];
}): Required<PairInput> {
  // ΔG°(CS) by Rehm–Weller with a −0.06 eV Coulomb term in MeCN (values rounded for the demo).
  const deltaG0 = Math.round((o.eox - o.ered - o.e00 - 0.06) * 1000) / 1000;
  const deltaG0CR = Math.round(-(o.eox - o.ered - 0.06) * 1000) / 1000;
  return {
    name: o.name,
    donor: o.donor,
    acceptor: o.acceptor,
    medium: 'acetonitrile',
    temperature: 298.15,
    temperatureUnit: 'K',
    notes: o.notes,
    status: o.status ?? 'active',
    tags: o.tags,
    model: o.model ?? 'marcus',
    parameters: [
      p(
        'donorOxidation',
        o.eox,
        'V',
        0.01,
        measured('Cyclic voltammetry, 0.1 M Bu4NPF6 in MeCN, vs Fc+/Fc, 100 mV/s'),
      ),
      p(
        'acceptorReduction',
        o.ered,
        'V',
        0.01,
        measured('Cyclic voltammetry, 0.1 M Bu4NPF6 in MeCN, vs Fc+/Fc'),
      ),
      p(
        'excitationEnergy',
        o.e00,
        'eV',
        0.02,
        measured('Crossing of normalised absorption and emission spectra'),
      ),
      p(
        'distance',
        o.r,
        'A',
        0.3,
        computed('Centre-to-centre distance of the optimised ground-state geometry'),
      ),
      p(
        'deltaG0',
        deltaG0,
        'eV',
        0.05,
        derived(
          'drivingForce.rehmWeller',
          {
            donorOxidation: o.eox,
            acceptorReduction: o.ered,
            excitationEnergy: o.e00,
            distance: o.r,
            epsilon: 35.9,
          },
          ['donorOxidation', 'acceptorReduction', 'excitationEnergy', 'distance', 'epsilonStatic'],
        ),
      ),
      p(
        'deltaG0Recombination',
        deltaG0CR,
        'eV',
        0.05,
        derived(
          'drivingForce.rehmWeller',
          {
            donorOxidation: o.eox,
            acceptorReduction: o.ered,
            excitationEnergy: o.e00,
            distance: o.r,
            epsilon: 35.9,
          },
          ['donorOxidation', 'acceptorReduction', 'distance'],
          'Charge recombination to the ground state',
        ),
      ),
      p('lambdaInner', o.lambdaInner, 'eV', 0.05, o.lambdaInnerProv),
      p(
        'lambdaOuter',
        o.lambdaOuter,
        'eV',
        0.1,
        derived(
          'reorg.twoSphere',
          {
            radiusDonor: 5.5,
            radiusAcceptor: 4.5,
            distance: o.r,
            epsilon: 35.9,
            refractiveIndex: 1.344,
          },
          ['radiusDonor', 'radiusAcceptor', 'distance', 'epsilonStatic', 'refractiveIndex'],
        ),
      ),
      p('coupling', cm1(o.couplingCm1), 'cm-1', cm1(o.couplingCm1 * 0.3), o.couplingProv),
      p(
        'radiusDonor',
        5.5,
        'A',
        null,
        computed('Solvent-excluded volume of the dye, sphere-equivalent radius'),
      ),
      p(
        'radiusAcceptor',
        4.5,
        'A',
        null,
        computed('Solvent-excluded volume of the acceptor, sphere-equivalent radius'),
      ),
      p(
        'epsilonStatic',
        35.9,
        '',
        null,
        literature('Group notebook 2026-03, solvent table (p. 2)'),
      ),
      p(
        'refractiveIndex',
        1.344,
        '',
        null,
        literature('Group notebook 2026-03, solvent table (p. 2)'),
      ),
      ...(o.extra ?? []),
    ],
  };
}

export const LAB_PAIRS: ReadonlyArray<Required<PairInput>> = [
  dyad({
    name: 'DA-1',
    donor: 'Dye P-12 (porphyrin-like)',
    acceptor: 'Acc N-4 (diimide)',
    eox: 0.35,
    ered: -1.05,
    e00: 2.05,
    r: 12.5,
    lambdaInner: 0.22,
    lambdaInnerProv: computed('Four-point energies, in-house DFT run gw-calc-031'),
    lambdaOuter: 0.78,
    couplingCm1: 45,
    couplingProv: computed('Fragment-orbital coupling, in-house DFT run gw-calc-032'),
    tags: ['dyad', 'charge-separation'],
    notes: 'Reference dyad of the series; charge separation in the normal region.',
  }),
  dyad({
    name: 'DA-2',
    donor: 'Dye P-12 (porphyrin-like)',
    acceptor: 'Acc N-6 (cyano-diimide)',
    eox: 0.35,
    ered: -0.72,
    e00: 2.05,
    r: 12.7,
    lambdaInner: 0.24,
    lambdaInnerProv: assumed('Taken equal to DA-1 plus 0.02 eV; not yet computed'),
    lambdaOuter: 0.79,
    couplingCm1: 40,
    couplingProv: literature('Group notebook 2026-03, p. 41 (transient absorption fit)'),
    tags: ['dyad', 'charge-separation'],
    notes: 'Stronger acceptor: near the activationless point.',
  }),
  dyad({
    name: 'DA-3',
    donor: 'Dye Q-7 (quinacridone-like)',
    acceptor: 'Acc N-6 (cyano-diimide)',
    eox: 0.62,
    ered: -0.72,
    e00: 2.9,
    r: 10.8,
    lambdaInner: 0.18,
    lambdaInnerProv: computed('Four-point energies, in-house DFT run gw-calc-040'),
    lambdaOuter: 0.72,
    couplingCm1: 120,
    couplingProv: derived(
      'coupling.gmh',
      { transitionDipole: 1.1, dipoleDifference: 19.5, transitionEnergy: 1.9 },
      [],
      'From the CT band of the dyad',
    ),
    tags: ['dyad', 'inverted', 'mlj'],
    model: 'mlj',
    extra: [p('hbarOmega', 0.18, 'eV', 0.02, assumed('Typical C=C/C=O skeletal mode, 1450 cm-1'))],
    notes:
      'High-energy excited state: charge separation in the inverted region; quantum mode matters.',
  }),
  dyad({
    name: 'DA-4',
    donor: 'Dye C-3 (coumarin-like)',
    acceptor: 'Acc N-4 (diimide)',
    eox: 0.82,
    ered: -1.05,
    e00: 2.6,
    r: 14.2,
    lambdaInner: 0.25,
    lambdaInnerProv: assumed('Generic value for rigid aromatics'),
    lambdaOuter: 0.85,
    couplingCm1: 15,
    couplingProv: derived(
      'coupling.distanceDecay',
      { coupling0: 0.05, distance0: 3.5, beta: 0.45, distance: 14.2 },
      ['distance'],
    ),
    tags: ['dyad', 'weak-coupling'],
    status: 'draft',
    notes: 'Longer bridge; slow, weakly driven.',
  }),
  dyad({
    name: 'DA-5',
    donor: 'Dye Q-7 (quinacridone-like)',
    acceptor: 'Acc F-2 (fullerene-like)',
    eox: 0.62,
    ered: -1.1,
    e00: 2.9,
    r: 11.5,
    lambdaInner: 0.12,
    lambdaInnerProv: literature('Group notebook 2026-02, p. 17 (fullerene-like acceptors)'),
    lambdaOuter: 0.55,
    couplingCm1: 80,
    couplingProv: computed('Fragment-orbital coupling, in-house DFT run gw-calc-052'),
    tags: ['dyad', 'recombination'],
    notes: 'Small λ acceptor: recombination pushed deep into the inverted region.',
  }),
  dyad({
    name: 'DA-6',
    donor: 'Dye P-12 (porphyrin-like)',
    acceptor: 'Acc Q-1 (quinone-like)',
    eox: 0.35,
    ered: -0.95,
    e00: 2.05,
    r: 7.2,
    lambdaInner: 0.3,
    lambdaInnerProv: computed('Four-point energies, in-house DFT run gw-calc-060'),
    lambdaOuter: 0.6,
    couplingCm1: 600,
    couplingProv: measured('Hush analysis of the intervalence band, film sample 2026-04-11'),
    tags: ['dyad', 'adiabatic'],
    model: 'crossover',
    extra: [
      p(
        'tauL',
        0.26e-12,
        'ps',
        0.03e-12,
        literature('Group notebook 2026-03, solvent table (p. 2)'),
      ),
    ],
    notes: 'Short, strongly coupled contact: solvent-controlled crossover model.',
  }),
];

function mediator(
  name: string,
  donor: string,
  acceptor: string,
  deltaG0: number,
  lambda: number,
  couplingCm1: number,
  tags: string[],
): Required<PairInput> {
  return {
    name,
    donor,
    acceptor,
    medium: '1 M KCl (aq)',
    temperature: 25 + 273.15,
    temperatureUnit: 'degC',
    notes: 'Homogeneous mediator–mediator electron transfer in the negolyte.',
    status: 'active',
    tags,
    model: 'marcus',
    parameters: [
      p(
        'deltaG0',
        deltaG0,
        'eV',
        0.02,
        measured('Difference of the two formal potentials, CV in 1 M KCl vs Ag/AgCl'),
      ),
      p(
        'lambdaOuter',
        lambda * 0.7,
        'kJ/mol',
        0.1,
        derived(
          'reorg.twoSphere',
          {
            radiusDonor: 3.8,
            radiusAcceptor: 3.6,
            distance: 7.4,
            epsilon: 78.4,
            refractiveIndex: 1.333,
          },
          [],
        ),
      ),
      p(
        'lambdaInner',
        lambda * 0.3,
        'eV',
        0.05,
        assumed('30 % of the total, as for similar small organics'),
      ),
      p('coupling', cm1(couplingCm1), 'cm-1', null, assumed('Contact pair estimate')),
    ],
  };
}

export const MEDIATOR_PAIRS: ReadonlyArray<Required<PairInput>> = [
  mediator('Med-12 / Med-7', 'Med-12 (reduced)', 'Med-7 (oxidised)', -0.18, 0.95, 150, [
    'negolyte',
  ]),
  mediator('Med-12 / Med-9', 'Med-12 (reduced)', 'Med-9 (oxidised)', -0.31, 1.05, 120, [
    'negolyte',
  ]),
  mediator('Med-3 / Med-7', 'Med-3 (reduced)', 'Med-7 (oxidised)', -0.06, 0.9, 180, [
    'negolyte',
    'slow',
  ]),
];

export interface SeedReport {
  readonly users: number;
  readonly workspaces: number;
  readonly pairs: number;
}

async function ensureUser(
  tx: EntityManager,
  email: string,
  displayName: string,
  passwordHash: string,
): Promise<{ id: string; created: boolean }> {
  const found = await findUserByEmail(tx, email);
  if (found) return { id: found.id, created: false };
  const user = await insertUser(tx, { email, displayName, passwordHash });
  return { id: user!.id, created: true };
}

/** The owner's workspace of that name, else a new one through the workspace use-case. */
async function ensureWorkspace(
  tx: EntityManager,
  name: string,
  ownerId: string,
): Promise<{ id: string; created: boolean }> {
  const found = await tx
    .getRepository(WorkspaceEntity)
    .createQueryBuilder('w')
    .innerJoin(
      MembershipEntity,
      'm',
      "m.workspaceId = w.id AND m.userId = :ownerId AND m.role = 'owner'",
      { ownerId },
    )
    .where('w.name = :name', { name })
    .orderBy('w.createdAt')
    .getOne();
  if (found) return { id: found.id, created: false };
  return { id: (await createWorkspaceIn(tx, ownerId, name)).id, created: true };
}

/** Adds the pair through the pair use-case (row, version 1, audit) unless its name is taken. */
async function ensurePair(
  tx: EntityManager,
  workspaceId: string,
  input: Required<PairInput>,
  userId: string,
): Promise<boolean> {
  if (await tx.getRepository(PairEntity).exists({ where: { workspaceId, name: input.name } }))
    return false;
  // The seed is a one-shot command with no HTTP to answer: its few pairs compute inline.
  await createPairIn(tx, userId, workspaceId, input, resultsFor(input));
  return true;
}

/**
 * Seeds the demo accounts, workspaces and pairs. Idempotent: what exists (matched by e-mail,
 * workspace name + owner, pair name) is left as it is, including changed passwords and roles.
 */
export async function seedDemo(
  dataSource: DataSource,
  options: { bcryptCost?: number } = {},
): Promise<SeedReport> {
  const hash = await bcrypt.hash(DEMO_PASSWORD, options.bcryptCost ?? 12);
  return dataSource.transaction(async (tx) => {
    // One seed at a time (two `npm start`s at once must not duplicate the demo).
    await tx.query('SELECT pg_advisory_xact_lock(424242)');
    let users = 0;
    let workspaces = 0;
    let pairs = 0;
    const ids: Record<string, string> = {};
    for (const account of DEMO_ACCOUNTS) {
      const u = await ensureUser(tx, account.email, account.displayName, hash);
      ids[account.role] = u.id;
      if (u.created) users++;
    }
    const ownerId = ids['owner']!;
    const lab = await ensureWorkspace(tx, DEMO_LAB, ownerId);
    if (lab.created) {
      workspaces++;
      for (const account of DEMO_ACCOUNTS.filter((a) => a.role !== 'owner')) {
        await upsertMembership(tx, lab.id, ids[account.role]!, account.role);
      }
    }
    const mediators = await ensureWorkspace(tx, DEMO_MEDIATORS, ownerId);
    if (mediators.created) workspaces++;
    for (const pair of LAB_PAIRS)
      if (await ensurePair(tx, lab.id, pair, ids['editor'] ?? ownerId)) pairs++;
    for (const pair of MEDIATOR_PAIRS)
      if (await ensurePair(tx, mediators.id, pair, ownerId)) pairs++;
    return { users, workspaces, pairs };
  });
}
