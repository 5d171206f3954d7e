import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import { ScreenEntity } from './screen';

/**
 * The good input rows of one chunk in canonical units, stored compactly as columnar JSON
 * (see apps/api/src/screens/screen-parser.ts `encodeInputChunk`).
 */
@Entity({ name: 'screen_inputs' })
export class ScreenInputEntity {
  @PrimaryColumn({ type: 'uuid', name: 'screen_id' })
  screenId: string;

  @PrimaryColumn({ type: 'integer', name: 'chunk_index' })
  chunkIndex: number;

  @Column({ type: 'text' })
  payload: string;

  @ManyToOne(() => ScreenEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'screen_id', foreignKeyConstraintName: 'FK_screen_inputs_screen' })
  screen: Relation<ScreenEntity>;
}
