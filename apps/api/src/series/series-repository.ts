/** Series and their points, through the TypeORM entities. Answers contracts shapes. */
import type { EntityManager } from 'typeorm';
import type {
  PairSeriesPoint,
  Series,
  SeriesFit,
  SeriesListItem,
  SeriesModelOptions,
  SeriesPoint,
} from '@gapwise/contracts';
import { SeriesEntity, SeriesPointEntity } from '@gapwise/db';
import { isUuid } from '../http/validate';

/** The series columns of a save, picked from what the use-case normalised. */
const columnsOf = (c: SeriesColumns) => ({
  name: c.name,
  temperatureK: c.temperatureK,
  temperatureUnit: c.temperatureUnit,
  energyUnit: c.energyUnit,
  notes: c.notes,
  modelOptions: { ...c.modelOptions },
  pairIds: [...c.pairIds],
});

/** What a save writes (canonical units). */
export interface SeriesColumns {
  readonly name: string;
  readonly temperatureK: number;
  readonly temperatureUnit: string;
  readonly energyUnit: string;
  readonly notes: string;
  readonly modelOptions: SeriesModelOptions;
  readonly pairIds: readonly string[];
}

const toPoint = (p: SeriesPointEntity): SeriesPoint => ({
  label: p.label,
  deltaG0: p.deltaG0,
  log10k: p.log10k,
  sigmaLog10k: p.sigmaLog10k,
  pairId: p.pairId,
});

/** Workspace of a series, or null when there is no such series. */
export async function seriesWorkspace(db: EntityManager, id: string): Promise<string | null> {
  if (!isUuid(id)) return null;
  const series = await db
    .getRepository(SeriesEntity)
    .findOne({ where: { id }, select: { id: true, workspaceId: true } });
  return series?.workspaceId ?? null;
}

/** A series with its points in order; `lock` takes the row lock (FOR UPDATE) for a write. */
export async function findSeries(
  db: EntityManager,
  id: string,
  lock = false,
): Promise<Series | null> {
  const query = db.getRepository(SeriesEntity).createQueryBuilder('s').where('s.id = :id', { id });
  if (lock) query.setLock('pessimistic_write');
  const s = await query.getOne();
  if (!s) return null;
  const points = await db
    .getRepository(SeriesPointEntity)
    .find({ where: { seriesId: id }, order: { position: 'ASC' } });
  return {
    id: s.id,
    workspaceId: s.workspaceId,
    name: s.name,
    temperature: s.temperatureK,
    energyUnit: s.energyUnit,
    notes: s.notes,
    modelOptions: s.modelOptions,
    pairIds: s.pairIds,
    fit: s.fit,
    version: s.version,
    createdAt: s.createdAt.toISOString(),
    updatedAt: s.updatedAt.toISOString(),
    points: points.map(toPoint),
  };
}

export async function insertSeries(
  db: EntityManager,
  workspaceId: string,
  columns: SeriesColumns,
  userId: string,
): Promise<string> {
  const repo = db.getRepository(SeriesEntity);
  const saved = await repo.save(
    repo.create({ ...columnsOf(columns), workspaceId, createdBy: userId }),
  );
  return saved.id;
}

/** Writes a new state, drops the old fit and bumps the version; the caller holds the row lock. */
export async function updateSeriesColumns(
  db: EntityManager,
  id: string,
  columns: SeriesColumns,
): Promise<void> {
  await db
    .createQueryBuilder()
    .update(SeriesEntity)
    .set({
      ...columnsOf(columns),
      fit: null,
      version: () => 'version + 1',
    })
    .where('id = :id', { id })
    .execute();
}

/** Stores a fit and the model options it was made with (the version stays). */
export async function saveSeriesFit(
  db: EntityManager,
  id: string,
  fit: SeriesFit,
  modelOptions: SeriesModelOptions,
): Promise<void> {
  // save() rather than update(): the fit's nested JSON is written as given.
  await db.getRepository(SeriesEntity).save({ id, fit, modelOptions });
}

/** Replaces the points of a series (positions in the given order). */
export async function replaceSeriesPoints(
  db: EntityManager,
  seriesId: string,
  points: readonly SeriesPoint[],
): Promise<void> {
  const repo = db.getRepository(SeriesPointEntity);
  await repo.delete({ seriesId });
  if (!points.length) return;
  await repo.insert(
    points.map((p, position) => ({
      seriesId,
      position,
      label: p.label,
      deltaG0: p.deltaG0,
      log10k: p.log10k,
      sigmaLog10k: p.sigmaLog10k,
      pairId: p.pairId,
    })),
  );
}

/** A workspace's series, most recently changed first, with their point counts. */
export async function listSeriesOf(
  db: EntityManager,
  workspaceId: string,
): Promise<SeriesListItem[]> {
  const rows = await db
    .getRepository(SeriesEntity)
    .createQueryBuilder('s')
    .select(['s.id AS id', 's.name AS name', 's.temperature_k AS temperature_k'])
    .addSelect(
      (sub) => sub.select('count(*)::int').from(SeriesPointEntity, 'p').where('p.series_id = s.id'),
      'n',
    )
    .addSelect('s.fit IS NOT NULL', 'fitted')
    .addSelect('s.updated_at', 'updated_at')
    .where('s.workspace_id = :workspaceId', { workspaceId })
    .orderBy('s.updated_at', 'DESC')
    .getRawMany<{
      id: string;
      name: string;
      temperature_k: number;
      n: number;
      fitted: boolean;
      updated_at: Date;
    }>();
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    temperature: r.temperature_k,
    pointCount: r.n,
    fitted: r.fitted,
    updatedAt: r.updated_at.toISOString(),
  }));
}

/**
 * Every point of a workspace's series that link the pair, in `pair_ids` or through one of
 * their points; by series name, then point order.
 */
export async function seriesPointsLinking(
  db: EntityManager,
  workspaceId: string,
  pairId: string,
): Promise<PairSeriesPoint[]> {
  const rows = await db
    .getRepository(SeriesPointEntity)
    .createQueryBuilder('p')
    .innerJoinAndSelect('p.series', 's')
    .where('s.workspaceId = :workspaceId', { workspaceId })
    .andWhere(
      `(:pairId = ANY(s.pair_ids) OR EXISTS (SELECT 1 FROM series_points q
          WHERE q.series_id = s.id AND q.pair_id = :pairId))`,
      { pairId },
    )
    .orderBy('s.name')
    .addOrderBy('s.id')
    .addOrderBy('p.position')
    .getMany();
  return rows.map((p) => ({
    seriesId: p.series.id,
    seriesName: p.series.name,
    ...toPoint(p),
  }));
}
