import {
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { SeriesEntity } from './series';

/** One measured point of a series: ΔG° in eV, log10 k (k in s⁻¹), optional σ of log10 k. */
@Entity({ name: 'series_points' })
@Index('idx_series_points_series', ['seriesId', 'position'])
export class SeriesPointEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'series_id' })
  seriesId: string;

  @Column({ type: 'integer' })
  position: number;

  @Column({ type: 'text', default: '' })
  label: string;

  @Column({ type: 'double precision', name: 'delta_g0' })
  deltaG0: number;

  @Column({ type: 'double precision' })
  log10k: number;

  @Column({ type: 'double precision', name: 'sigma_log10k', nullable: true })
  sigmaLog10k: number | null;

  @Column({ type: 'uuid', name: 'pair_id', nullable: true })
  pairId: string | null;

  @ManyToOne(() => SeriesEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'series_id', foreignKeyConstraintName: 'FK_series_points_series' })
  series: Relation<SeriesEntity>;
}
