import { Column, Entity, JoinColumn, ManyToOne, OneToMany, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { ThreadAnchor, ThreadStatus } from '../../shared/reviews';
import { User } from '../auth/user.entity';
import { Comment } from './comment.entity';

/** A discussion pinned to a point, a region or a measurement of an image, or to a figure or one of its panels. */
@Entity({ name: 'comment_threads' })
export class CommentThread {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  /** Exactly one of image and figure is set. */
  @Column({ name: 'image_id', type: 'uuid', nullable: true })
  imageId!: string | null;

  @Column({ name: 'figure_id', type: 'uuid', nullable: true })
  figureId!: string | null;

  @Column({ name: 'anchor_kind', type: 'text' })
  anchorKind!: ThreadAnchor['kind'];

  @Column({ type: 'jsonb' })
  anchor!: ThreadAnchor;

  /** Kept as a plain id: the thread outlives a deleted measurement. */
  @Column({ name: 'measurement_id', type: 'uuid', nullable: true })
  measurementId!: string | null;

  @Column({ type: 'text', default: 'open' })
  status!: ThreadStatus;

  @Column({ name: 'created_by', type: 'uuid' })
  createdBy!: string;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'created_by' })
  creator!: Relation<User>;

  @Column({ name: 'created_at', type: 'timestamptz', insert: false, update: false })
  createdAt!: Date;

  @Column({ name: 'resolved_by', type: 'uuid', nullable: true })
  resolvedBy!: string | null;

  @ManyToOne(() => User, { nullable: true })
  @JoinColumn({ name: 'resolved_by' })
  resolver!: Relation<User> | null;

  @Column({ name: 'resolved_at', type: 'timestamptz', nullable: true })
  resolvedAt!: Date | null;

  @OneToMany(() => Comment, (c) => c.thread)
  comments!: Relation<Comment>[];
}
