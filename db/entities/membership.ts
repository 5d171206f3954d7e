import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryColumn,
  type Relation,
} from 'typeorm';
import type { Role } from '@gapwise/contracts';
import { UserEntity } from './user';
import { WorkspaceEntity } from './workspace';

/** A user's role in one workspace (owner, editor, reviewer, viewer). */
@Entity({ name: 'memberships' })
@Index('idx_memberships_user', ['userId'])
export class MembershipEntity {
  @PrimaryColumn({ type: 'uuid', name: 'workspace_id' })
  workspaceId: string;

  @PrimaryColumn({ type: 'uuid', name: 'user_id' })
  userId: string;

  @Column({ type: 'text' })
  role: Role;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @ManyToOne(() => WorkspaceEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'workspace_id' })
  workspace: Relation<WorkspaceEntity>;

  @ManyToOne(() => UserEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user: Relation<UserEntity>;
}
