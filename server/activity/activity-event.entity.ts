import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { ActivityAction } from '../../shared/activity';
import { User } from '../auth/user.entity';

/** One thing someone did in a project; rows are only ever inserted. */
@Entity({ name: 'activity_events' })
export class ActivityEvent {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  /** Order of recording; the database numbers it. */
  @Column({ type: 'bigint', insert: false, update: false })
  seq!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  @Column({ name: 'image_id', type: 'uuid', nullable: true })
  imageId!: string | null;

  @Column({ name: 'actor_id', type: 'uuid' })
  actorId!: string;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'actor_id' })
  actor!: Relation<User>;

  @Column({ type: 'text' })
  action!: ActivityAction;

  @Column({ type: 'text' })
  summary!: string;

  @Column({ type: 'jsonb', default: {} })
  details!: Record<string, unknown>;

  @Column({ type: 'timestamptz', insert: false, update: false })
  at!: Date;
}
