import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import { ScreenEntity } from './screen';

/** One chunk of a screen: a range of input lines, computed as one pg-boss job. */
@Entity({ name: 'screen_chunks' })
export class ScreenChunkEntity {
  @PrimaryColumn({ type: 'uuid', name: 'screen_id' })
  screenId: string;

  @PrimaryColumn({ type: 'integer', name: 'chunk_index' })
  chunkIndex: number;

  @Column({ type: 'integer', name: 'first_line' })
  firstLine: number;

  @Column({ type: 'integer', name: 'last_line' })
  lastLine: number;

  @Column({ type: 'integer', name: 'row_count' })
  rowCount: number;

  /** pending | done | cancelled */
  @Column({ type: 'text', default: 'pending' })
  status: string;

  @Column({ type: 'integer', default: 0 })
  attempts: number;

  @Column({ type: 'text', nullable: true })
  worker: string | null;

  @Column({ type: 'timestamptz', name: 'finished_at', nullable: true })
  finishedAt: Date | null;

  @ManyToOne(() => ScreenEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'screen_id', foreignKeyConstraintName: 'FK_screen_chunks_screen' })
  screen: Relation<ScreenEntity>;
}
