import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { User } from '../auth/user.entity';

/** One change of an image's pixel size; the app only ever inserts these. */
@Entity({ name: 'calibration_changes' })
export class CalibrationChange {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'image_id', type: 'uuid' })
  imageId!: string;

  @Column({ name: 'user_id', type: 'uuid' })
  userId!: string;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'user_id' })
  user!: Relation<User>;

  @Column({ type: 'timestamptz', insert: false, update: false })
  at!: Date;

  @Column({ name: 'old_um_per_px', type: 'double precision', nullable: true })
  oldUmPerPx!: number | null;

  @Column({ name: 'new_um_per_px', type: 'double precision', nullable: true })
  newUmPerPx!: number | null;

  @Column({ type: 'text' })
  source!: string;

  @Column({ type: 'text', default: '' })
  note!: string;
}
