import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { Affine, AlignmentKind, PointPair } from '../../shared/viewer/alignment';
import { User } from '../auth/user.entity';

/** The other image laid on the image: pairs as clicked and the transform fitted from them (other px → image px). */
@Entity({ name: 'image_alignments' })
export class ImageAlignment {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  @Column({ name: 'image_id', type: 'uuid' })
  imageId!: string;

  @Column({ name: 'other_image_id', type: 'uuid' })
  otherImageId!: string;

  @Column({ type: 'text' })
  kind!: AlignmentKind;

  @Column({ type: 'jsonb' })
  pairs!: PointPair[];

  /** Kept for people reading the table; reads fit it again from the pairs. */
  @Column({ type: 'jsonb' })
  transform!: Affine;

  @Column({ name: 'saved_by', type: 'uuid' })
  savedBy!: string;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'saved_by' })
  savedByUser!: Relation<User>;

  @Column({ name: 'saved_at', type: 'timestamptz' })
  savedAt!: Date;
}
