import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import type { ReviewState, ReviewSubjectType } from '../../shared/reviews';
import { User } from '../auth/user.entity';

/** Where one image or figure stands in review. No row means a draft nobody has submitted. */
@Entity({ name: 'review_states' })
export class Review {
  @PrimaryColumn({ name: 'subject_type', type: 'text' })
  subjectType!: ReviewSubjectType;

  @PrimaryColumn({ name: 'subject_id', type: 'uuid' })
  subjectId!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  /** Set for images only, so deleting the image deletes its state. */
  @Column({ name: 'image_id', type: 'uuid', nullable: true })
  imageId!: string | null;

  /** Set for figures only, so deleting the figure deletes its state. */
  @Column({ name: 'figure_id', type: 'uuid', nullable: true })
  figureId!: string | null;

  @Column({ type: 'text' })
  state!: ReviewState;

  @Column({ name: 'submitted_by', type: 'uuid', nullable: true })
  submittedBy!: string | null;

  @ManyToOne(() => User, { nullable: true })
  @JoinColumn({ name: 'submitted_by' })
  submitter!: Relation<User> | null;

  @Column({ name: 'submitted_at', type: 'timestamptz', nullable: true })
  submittedAt!: Date | null;

  @Column({ name: 'updated_by', type: 'uuid' })
  updatedBy!: string;

  @Column({ name: 'updated_at', type: 'timestamptz', default: () => 'clock_timestamp()' })
  updatedAt!: Date;
}
