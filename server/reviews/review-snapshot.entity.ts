import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { Annotation } from '../../shared/annotations/annotations';
import type { PixelSizeInfo } from '../../shared/images';
import type { ReviewSubjectType, SnapshotMeasurement } from '../../shared/reviews';
import { User } from '../auth/user.entity';

/** What was cleared, frozen at that moment; append-only, and kept after the image changes or goes. */
@Entity({ name: 'review_snapshots' })
export class ReviewSnapshot {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'bigint', insert: false, update: false })
  seq!: string;

  @Column({ name: 'subject_type', type: 'text' })
  subjectType!: ReviewSubjectType;

  @Column({ name: 'subject_id', type: 'uuid' })
  subjectId!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  /** The 'clear' event this snapshot belongs to. */
  @Column({ name: 'event_id', type: 'uuid' })
  eventId!: string;

  @Column({ name: 'cleared_by', type: 'uuid' })
  clearedBy!: string;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'cleared_by' })
  clearer!: Relation<User>;

  @Column({ name: 'cleared_at', type: 'timestamptz', insert: false, update: false })
  clearedAt!: Date;

  @Column({ name: 'pixel_size', type: 'jsonb' })
  pixelSize!: PixelSizeInfo;

  @Column({ type: 'jsonb' })
  annotations!: Annotation[];

  @Column({ type: 'jsonb' })
  measurements!: SnapshotMeasurement[];
}
