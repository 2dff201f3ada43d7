import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import type { AnnotationKind, Coordinates } from '../../shared/annotations/annotations';
import { User } from '../auth/user.entity';

/** A shape on an image, in full-resolution pixels; `version` guards against silent overwrites. */
@Entity({ name: 'annotations' })
export class Annotation {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  /** Drawing order; the database numbers it. */
  @Column({ type: 'bigint', insert: false, update: false, select: false })
  seq!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  @Column({ name: 'image_id', type: 'uuid' })
  imageId!: string;

  @Column({ name: 'class_id', type: 'uuid' })
  classId!: string;

  @Column({ type: 'text' })
  kind!: AnnotationKind;

  @Column({ type: 'jsonb' })
  points!: Coordinates;

  @Column({ type: 'text', default: '' })
  label!: string;

  @Column({ name: 'author_id', type: 'uuid' })
  authorId!: string;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'author_id' })
  author!: Relation<User>;

  @Column({ name: 'updated_by', type: 'uuid' })
  updatedBy!: string;

  @Column({ type: 'int', default: 1 })
  version!: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt!: Date;
}
