/** Series use-cases: create, list, read, update (optimistic version), fit, apply to pairs. */
import type { DataSource, EntityManager } from 'typeorm';
import { toCanonical } from '@gapwise/calc';
import {
  canEdit,
  formatNumber,
  magnitudeProblem,
  modelName,
  type Pair,
  type PairParameter,
  type PairSeriesPoint,
  type Provenance,
  type Series,
  type SeriesFit,
  type SeriesListItem,
  type SeriesModel,
  type SeriesPoint,
} from '@gapwise/contracts';
import { recordAudit } from '../audit/audit-repository';
import { AppError, notFound, validationFailed } from '../http/app-error';
import { findPair } from '../pairs/pair-repository';
import {
  inputOf,
  pairForCaller,
  prepareSave,
  savePairIn,
  type PreparedSave,
} from '../pairs/pair-use-case';
import { requireRole } from '../workspaces/workspace-access';
import { requireWorkspaceReferences } from '../workspaces/workspace-references';
import type { SeriesApplyDto, SeriesFitDto, SeriesInputDto } from './series-dto';
import type { ComputeRunner } from '../compute/compute-tasks';

type FieldError = { field: string; message: string };

interface Normalised {
  name: string;
  temperatureK: number;
  temperatureUnit: string;
  energyUnit: string;
  notes: string;
  modelOptions: Record<string, unknown>;
  pairIds: string[];
  points: SeriesPoint[];
}

/** Converts typed units to canonical ones and checks each point (all problems listed). */
export function normaliseSeries(dto: SeriesInputDto): Normalised {
  const errors: FieldError[] = [];
  const energyUnit = dto.energyUnit ?? 'eV';
  const temperatureUnit = dto.temperatureUnit ?? 'K';
  const temperatureK = toCanonical(dto.temperature, temperatureUnit, 'temperature');
  if (!(temperatureK > 0))
    errors.push({
      field: 'temperature',
      message: 'Temperature must be > 0 K (absolute). Did you enter °C?',
    });
  if (!dto.name.trim()) errors.push({ field: 'name', message: 'must not be blank' });
  const points: SeriesPoint[] = dto.points.map((p, i) => {
    let log10k = p.log10k;
    if (p.k !== undefined) {
      if (!(p.k > 0)) errors.push({ field: `points.${i}.k`, message: 'k must be > 0 s⁻¹.' });
      else if (log10k === undefined) log10k = Math.log10(p.k);
    }
    if (log10k === undefined) errors.push({ field: `points.${i}`, message: 'give k or log10k' });
    const deltaG0Ev = toCanonical(p.deltaG0, energyUnit, 'energy');
    const tooLarge = magnitudeProblem('energy', deltaG0Ev);
    if (tooLarge) errors.push({ field: `points.${i}.deltaG0`, message: tooLarge });
    return {
      label: p.label ?? '',
      deltaG0: toCanonical(p.deltaG0, energyUnit, 'energy'),
      log10k: log10k ?? Number.NaN,
      sigmaLog10k: p.sigmaLog10k ?? null,
      pairId: p.pairId ?? null,
    };
  });
  const mo = dto.modelOptions ?? {};
  if (mo.hbarOmega !== undefined && !(mo.hbarOmega > 0))
    errors.push({ field: 'modelOptions.hbarOmega', message: 'Mode energy must be > 0.' });
  if (mo.lambdaVib !== undefined && !(mo.lambdaVib >= 0))
    errors.push({ field: 'modelOptions.lambdaVib', message: 'Huang–Rhys factor must be ≥ 0.' });
  if (errors.length) throw validationFailed(errors);
  return {
    name: dto.name.trim(),
    temperatureK,
    temperatureUnit,
    energyUnit,
    notes: dto.notes ?? '',
    modelOptions: { ...mo },
    pairIds: dto.pairIds ?? [],
    points,
  };
}

interface SeriesRow {
  id: string;
  workspace_id: string;
  name: string;
  temperature_k: number;
  temperature_unit: string;
  energy_unit: string;
  model_options: Record<string, unknown>;
  pair_ids: string[];
  fit: SeriesFit | null;
  notes: string;
  version: number;
  created_at: Date;
  updated_at: Date;
}

async function loadSeries(db: EntityManager, id: string, lock = false): Promise<Series | null> {
  const rows: SeriesRow[] = await db.query(
    `SELECT * FROM series WHERE id = $1${lock ? ' FOR UPDATE' : ''}`,
    [id],
  );
  const r = rows[0];
  if (!r) return null;
  const points: Array<{
    label: string;
    delta_g0: number;
    log10k: number;
    sigma_log10k: number | null;
    pair_id: string | null;
  }> = await db.query(
    'SELECT label, delta_g0, log10k, sigma_log10k, pair_id FROM series_points WHERE series_id = $1 ORDER BY position',
    [id],
  );
  return {
    id: r.id,
    workspaceId: r.workspace_id,
    name: r.name,
    temperature: r.temperature_k,
    energyUnit: r.energy_unit,
    notes: r.notes,
    modelOptions: r.model_options,
    pairIds: r.pair_ids,
    fit: r.fit,
    version: r.version,
    createdAt: r.created_at.toISOString(),
    updatedAt: r.updated_at.toISOString(),
    points: points.map((p) => ({
      label: p.label,
      deltaG0: p.delta_g0,
      log10k: p.log10k,
      sigmaLog10k: p.sigma_log10k,
      pairId: p.pair_id,
    })),
  };
}

async function writePoints(
  tx: EntityManager,
  seriesId: string,
  points: readonly SeriesPoint[],
): Promise<void> {
  await tx.query('DELETE FROM series_points WHERE series_id = $1', [seriesId]);
  if (!points.length) return;
  await tx.query(
    `INSERT INTO series_points (series_id, position, label, delta_g0, log10k, sigma_log10k, pair_id)
     SELECT $1, * FROM unnest($2::int[], $3::text[], $4::float8[], $5::float8[], $6::float8[], $7::uuid[])`,
    [
      seriesId,
      points.map((_, i) => i),
      points.map((p) => p.label),
      points.map((p) => p.deltaG0),
      points.map((p) => p.log10k),
      points.map((p) => p.sigmaLog10k),
      points.map((p) => p.pairId),
    ],
  );
}

/** The series' workspace after checking the caller's role (404 for non-members). */
export async function seriesForCaller(
  db: EntityManager,
  id: string,
  userId: string,
  allowed: Parameters<typeof requireRole>[3] = () => true,
): Promise<string> {
  const rows: Array<{ workspace_id: string }> = await db.query(
    'SELECT workspace_id FROM series WHERE id = $1',
    [id],
  );
  if (!rows[0]) throw notFound('series');
  await requireRole(db, rows[0].workspace_id, userId, allowed, 'series');
  return rows[0].workspace_id;
}

export async function createSeries(
  db: DataSource,
  userId: string,
  workspaceId: string,
  dto: SeriesInputDto,
): Promise<Series> {
  const n = normaliseSeries(dto);
  const id = await db.transaction(async (tx) => {
    await requireRole(tx, workspaceId, userId, canEdit);
    await requireWorkspaceReferences(tx, workspaceId, seriesReferences(n));
    const rows: Array<{ id: string }> = await tx.query(
      `INSERT INTO series (workspace_id, name, temperature_k, temperature_unit, energy_unit, model_options, pair_ids, notes, created_by)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9) RETURNING id`,
      [
        workspaceId,
        n.name,
        n.temperatureK,
        n.temperatureUnit,
        n.energyUnit,
        JSON.stringify(n.modelOptions),
        n.pairIds,
        n.notes,
        userId,
      ],
    );
    await writePoints(tx, rows[0].id, n.points);
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'series.created',
      entityType: 'series',
      entityId: rows[0].id,
      summary: `series ${n.name}: ${n.points.length} ${n.points.length === 1 ? 'point' : 'points'}`,
    });
    return rows[0].id;
  });
  return (await loadSeries(db.manager, id))!;
}

export async function listSeries(
  db: EntityManager,
  workspaceId: string,
): Promise<SeriesListItem[]> {
  const rows: Array<{
    id: string;
    name: string;
    temperature_k: number;
    n: number;
    fitted: boolean;
    updated_at: Date;
  }> = await db.query(
    `SELECT s.id, s.name, s.temperature_k, (SELECT count(*)::int FROM series_points p WHERE p.series_id = s.id) AS n,
            s.fit IS NOT NULL AS fitted, s.updated_at
       FROM series s WHERE s.workspace_id = $1 ORDER BY s.updated_at DESC`,
    [workspaceId],
  );
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    temperature: r.temperature_k,
    pointCount: r.n,
    fitted: r.fitted,
    updatedAt: r.updated_at.toISOString(),
  }));
}

export async function readSeries(db: DataSource, userId: string, id: string): Promise<Series> {
  await seriesForCaller(db.manager, id, userId);
  return (await loadSeries(db.manager, id))!;
}

/**
 * Every point of the pair's workspace's series that link the pair, in `pair_ids` or through one
 * of their points (same access as reading the pair: members only, non-members 404).
 */
export async function seriesPointsOfPair(
  db: DataSource,
  userId: string,
  pairId: string,
): Promise<PairSeriesPoint[]> {
  const { workspaceId } = await pairForCaller(db.manager, pairId, userId);
  const rows: Array<{
    series_id: string;
    series_name: string;
    label: string;
    delta_g0: number;
    log10k: number;
    sigma_log10k: number | null;
    pair_id: string | null;
  }> = await db.manager.query(
    `SELECT s.id AS series_id, s.name AS series_name, p.label, p.delta_g0, p.log10k, p.sigma_log10k, p.pair_id
       FROM series s JOIN series_points p ON p.series_id = s.id
      WHERE s.workspace_id = $1
        AND ($2 = ANY(s.pair_ids)
             OR EXISTS (SELECT 1 FROM series_points q WHERE q.series_id = s.id AND q.pair_id = $2))
      ORDER BY s.name, s.id, p.position`,
    [workspaceId, pairId],
  );
  return rows.map((r) => ({
    seriesId: r.series_id,
    seriesName: r.series_name,
    label: r.label,
    deltaG0: r.delta_g0,
    log10k: r.log10k,
    sigmaLog10k: r.sigma_log10k,
    pairId: r.pair_id,
  }));
}

/** Saves a new state from `version`; a stale version answers 409. The old fit is dropped. */
export async function updateSeries(
  db: DataSource,
  userId: string,
  id: string,
  dto: SeriesInputDto & { version: number },
): Promise<Series> {
  const n = normaliseSeries(dto);
  await db.transaction(async (tx) => {
    const workspaceId = await seriesForCaller(tx, id, userId, canEdit);
    const current = (await loadSeries(tx, id, true))!;
    if (current.version !== dto.version) {
      throw new AppError(
        409,
        'version-conflict',
        `This series was changed by someone else (now version ${current.version}).`,
        { current },
      );
    }
    await requireWorkspaceReferences(tx, workspaceId, seriesReferences(n));
    await tx.query(
      `UPDATE series SET name = $2, temperature_k = $3, temperature_unit = $4, energy_unit = $5, model_options = $6,
         pair_ids = $7, notes = $8, fit = NULL, version = version + 1, updated_at = now() WHERE id = $1`,
      [
        id,
        n.name,
        n.temperatureK,
        n.temperatureUnit,
        n.energyUnit,
        JSON.stringify(n.modelOptions),
        n.pairIds,
        n.notes,
      ],
    );
    await writePoints(tx, id, n.points);
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'series.updated',
      entityType: 'series',
      entityId: id,
      summary: `series ${n.name} v${current.version + 1}`,
    });
  });
  return (await loadSeries(db.manager, id))!;
}

export async function fitSeriesUseCase(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  id: string,
  dto: SeriesFitDto,
): Promise<Series> {
  // The fit runs in the compute pool before any transaction opens (no transaction is held open
  // while a calculation runs); the write then checks the series is still the version fitted.
  await seriesForCaller(db.manager, id, userId, canEdit);
  const fitted = (await loadSeries(db.manager, id))!;
  if (dto.model === 'mlj' && (dto.hbarOmega === undefined || dto.lambdaVib === undefined)) {
    throw validationFailed([
      { field: 'hbarOmega', message: 'MLJ needs hbarOmega and lambdaVib (eV).' },
    ]);
  }
  const fit = await compute.run('seriesFit', [fitted.points, fitted.temperature, dto], {
    budget: 'interactive',
    advice:
      'Fit with a larger ħω, a smaller λ_vib or fewer points, or fit the classical Marcus model.',
  });
  await db.transaction(async (tx) => {
    const workspaceId = await seriesForCaller(tx, id, userId, canEdit);
    const series = (await loadSeries(tx, id, true))!;
    if (series.version !== fitted.version)
      throw new AppError(
        409,
        'version-conflict',
        'The series changed while it was being fitted; fit it again.',
        { current: series },
      );
    await tx.query(
      `UPDATE series SET fit = $2, model_options = $3, updated_at = now() WHERE id = $1`,
      [
        id,
        JSON.stringify(fit),
        JSON.stringify({ model: dto.model, hbarOmega: dto.hbarOmega, lambdaVib: dto.lambdaVib }),
      ],
    );
    const main = fit.fits[dto.model]!;
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'series.fitted',
      entityType: 'series',
      entityId: id,
      // Read by people on the audit page: the model by name, |H_AB| in meV, 3 significant figures.
      summary: `series ${series.name} fitted with ${modelName(dto.model)}: λ = ${formatNumber(main.lambda, 3)} eV, coupling = ${formatNumber(main.coupling * 1000, 3)} meV`,
    });
  });
  return (await loadSeries(db.manager, id))!;
}

/**
 * Writes the fitted λ and |H_AB| into each pair as derived parameters whose provenance points
 * to the series (through the pair use-case: new version and audit event per pair). Classical
 * Marcus fits a total λ: it is stored as λ_outer = λ − λ_inner (the pair's λ_inner kept; set to
 * 0 when larger than the fitted λ). MLJ fits λ_s, stored as λ_outer, with the fixed mode (ħω,
 * λ_vib as λ_inner).
 */
export async function applySeries(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  id: string,
  dto: SeriesApplyDto,
): Promise<Pair[]> {
  const workspaceId = await seriesForCaller(db.manager, id, userId, canEdit);
  const series = (await loadSeries(db.manager, id))!;
  const model: SeriesModel = dto.model ?? series.fit?.model ?? 'marcus';
  const fit = series.fit?.fits[model];
  if (!fit)
    throw new AppError(409, 'series-not-fitted', `Fit the series with the ${model} model first.`);
  const ids = [...new Set(dto.pairIds.map((p) => p.toLowerCase()))];
  const references = ids.map((pairId, i) => ({ field: `pairIds.${i}`, type: 'pair', id: pairId }));
  // Checked before computing (a foreign or unknown id is named at once) and again when writing.
  await requireWorkspaceReferences(db.manager, workspaceId, references);
  // Every pair's new results are computed in the pool before the transaction opens.
  const prepared: PreparedSave[] = [];
  for (const pairId of ids) {
    const current = (await findPair(db.manager, pairId))!;
    const sources = [{ type: 'series', id }];
    const methodInputs = {
      seriesId: id,
      seriesVersion: series.version,
      // The provenance sentence names the series; the id links to it.
      seriesName: series.name,
      model,
      points: series.points.length,
      temperature: series.temperature,
    };
    const note = `Fitted to series "${series.name}" (${model}, ${series.points.length} points).`;
    const derived: Provenance = {
      kind: 'derived',
      methodId: 'fit.drivingForceSeries',
      methodInputs,
      sources,
      note,
    };
    const save = await prepareSave(db, compute, userId, pairId, current.version, (p) => {
      const input = inputOf(p);
      const keep = input.parameters.filter(
        (x) =>
          ![
            'lambdaOuter',
            'coupling',
            ...(model === 'mlj' ? ['lambdaInner', 'hbarOmega'] : []),
          ].includes(x.kind),
      );
      const params: PairParameter[] = [...keep];
      const inner = params.find((x) => x.kind === 'lambdaInner');
      let outer = fit.lambda;
      let outerSe = fit.standardErrors.lambda;
      if (model === 'marcus' && inner) {
        if (inner.value < fit.lambda) outer = fit.lambda - inner.value;
        else
          params.splice(params.indexOf(inner), 1, {
            ...inner,
            value: 0,
            provenance: {
              ...derived,
              note: `${note} λ_inner set to 0: the fitted total λ is smaller.`,
            },
          });
      }
      if (model === 'mlj') {
        params.push({
          kind: 'lambdaInner',
          value: series.fit!.lambdaVib!,
          unit: 'eV',
          uncertainty: null,
          provenance: { ...derived, note: `${note} Fixed λ_vib of the fit.` },
        });
        params.push({
          kind: 'hbarOmega',
          value: series.fit!.hbarOmega!,
          unit: 'eV',
          uncertainty: null,
          provenance: { ...derived, note: `${note} Fixed ħω of the fit.` },
        });
      } else outerSe = fit.standardErrors.lambda;
      params.push({
        kind: 'lambdaOuter',
        value: outer,
        unit: 'eV',
        uncertainty: outerSe,
        provenance: derived,
      });
      params.push({
        kind: 'coupling',
        value: fit.coupling,
        unit: 'eV',
        uncertainty: fit.standardErrors.coupling,
        provenance: derived,
      });
      return { ...input, model: model === 'mlj' ? 'mlj' : input.model, parameters: params };
    });
    prepared.push(save);
  }
  // All or nothing: every pair is checked and saved in one transaction, so one foreign or
  // unknown id, or a pair changed meanwhile (409), leaves every pair as it was.
  return db.transaction(async (tx) => {
    await requireWorkspaceReferences(tx, workspaceId, references);
    const out: Pair[] = [];
    for (const save of prepared) {
      out.push(
        await savePairIn(
          tx,
          userId,
          save,
          'pair.series-applied',
          `λ and |H_AB| from series ${series.name}`,
        ),
      );
    }
    return out;
  });
}

/** The pairs a series links (its pair list and its points), with their request field names. */
function seriesReferences(n: { pairIds: readonly string[]; points: readonly SeriesPoint[] }) {
  return [
    ...n.pairIds.map((id, i) => ({ field: `pairIds.${i}`, type: 'pair', id })),
    ...n.points.flatMap((p, i) =>
      p.pairId ? [{ field: `points.${i}.pairId`, type: 'pair', id: p.pairId }] : [],
    ),
  ];
}
