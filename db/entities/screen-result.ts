import {
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryColumn,
  type Relation,
} from 'typeorm';
import { ScreenEntity } from './screen';

/**
 * One computed pair of a screen (canonical units: eV, K; rates as log10 k in s⁻¹). The primary
 * key (screen_id, row_number) makes a re-run chunk unable to duplicate rows; the indexes serve
 * the sortable columns of the results table.
 */
@Entity({ name: 'screen_results' })
@Index('idx_screen_results_score', ['screenId', 'score'])
@Index('idx_screen_results_dg_cs', ['screenId', 'deltaGCs'])
@Index('idx_screen_results_dg_cr', ['screenId', 'deltaGCr'])
@Index('idx_screen_results_k_cs', ['screenId', 'log10kCsMarcus'])
@Index('idx_screen_results_k_cr', ['screenId', 'log10kCrMarcus'])
export class ScreenResultEntity {
  @PrimaryColumn({ type: 'uuid', name: 'screen_id' })
  screenId: string;

  /** Line number of the row in the uploaded file. */
  @PrimaryColumn({ type: 'integer', name: 'row_number' })
  rowNumber: number;

  @Column({ type: 'text' })
  donor: string;

  @Column({ type: 'text' })
  acceptor: string;

  @Column({ type: 'text', default: '' })
  solvent: string;

  @Column({ type: 'double precision', name: 'delta_g_cs', nullable: true })
  deltaGCs: number | null;

  @Column({ type: 'double precision', name: 'delta_g_cr', nullable: true })
  deltaGCr: number | null;

  @Column({ type: 'double precision', name: 'lambda_inner', nullable: true })
  lambdaInner: number | null;

  @Column({ type: 'double precision', name: 'lambda_outer', nullable: true })
  lambdaOuter: number | null;

  @Column({ type: 'double precision', name: 'lambda_total', nullable: true })
  lambdaTotal: number | null;

  @Column({ type: 'double precision', nullable: true })
  coupling: number | null;

  @Column({ type: 'double precision', name: 'temperature_k', nullable: true })
  temperatureK: number | null;

  @Column({ type: 'double precision', name: 'log10k_cs_marcus', nullable: true })
  log10kCsMarcus: number | null;

  @Column({ type: 'double precision', name: 'log10k_cr_marcus', nullable: true })
  log10kCrMarcus: number | null;

  @Column({ type: 'double precision', name: 'log10k_cs_mlj', nullable: true })
  log10kCsMlj: number | null;

  @Column({ type: 'double precision', name: 'log10k_cr_mlj', nullable: true })
  log10kCrMlj: number | null;

  @Column({ type: 'text', name: 'regime_cs', nullable: true })
  regimeCs: string | null;

  @Column({ type: 'text', name: 'regime_cr', nullable: true })
  regimeCr: string | null;

  /** Bit mask of SCREEN_WARNINGS (apps/api/src/screens/chunk-computer.ts). */
  @Column({ type: 'integer', name: 'warning_mask', default: 0 })
  warningMask: number;

  @Column({ type: 'double precision', nullable: true })
  score: number | null;

  // No foreign key in the database (migration 1796500000000): a per-row check dominated the
  // cost of storing results; a trigger on screens deletes them with their screen.
  @ManyToOne(() => ScreenEntity, { createForeignKeyConstraints: false })
  @JoinColumn({ name: 'screen_id' })
  screen: Relation<ScreenEntity>;
}
