import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { ReviewEvent as ReviewEventDto, ReviewState, ReviewSubjectType } from '../../shared/reviews';
import { User } from '../auth/user.entity';

/** One move in a review's history; rows are only ever inserted (a trigger refuses changes). */
@Entity({ name: 'review_events' })
export class ReviewEvent {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  /** Order of recording; the database numbers it. */
  @Column({ type: 'bigint', insert: false, update: false })
  seq!: string;

  @Column({ name: 'subject_type', type: 'text' })
  subjectType!: ReviewSubjectType;

  @Column({ name: 'subject_id', type: 'uuid' })
  subjectId!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  @Column({ name: 'from_state', type: 'text' })
  fromState!: ReviewState;

  @Column({ name: 'to_state', type: 'text' })
  toState!: ReviewState;

  @Column({ type: 'text' })
  reason!: ReviewEventDto['reason'];

  @Column({ name: 'actor_id', type: 'uuid' })
  actorId!: string;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'actor_id' })
  actor!: Relation<User>;

  @Column({ type: 'text', default: '' })
  note!: string;

  @Column({ type: 'timestamptz', insert: false, update: false })
  at!: Date;
}
