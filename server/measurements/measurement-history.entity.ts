import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { MeasurementHistoryEntry, MeasurementResult } from '../../shared/measurements/measurement-records';
import type { MeasurementBody } from '../../shared/measurements/measurements';
import { User } from '../auth/user.entity';

/** A result as it was before an edit, a recompute or a deletion; only ever inserted (a trigger refuses the rest). */
@Entity({ name: 'measurement_history' })
export class MeasurementHistory {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'bigint', insert: false, update: false, select: false })
  seq!: string;

  @Column({ name: 'measurement_id', type: 'uuid' })
  measurementId!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  @Column({ name: 'image_id', type: 'uuid' })
  imageId!: string;

  @Column({ type: 'int' })
  version!: number;

  @Column({ type: 'text' })
  reason!: MeasurementHistoryEntry['reason'];

  @Column({ type: 'jsonb' })
  definition!: MeasurementBody;

  @Column({ type: 'jsonb' })
  result!: MeasurementResult;

  @Column({ name: 'um_per_px', type: 'double precision' })
  umPerPx!: number;

  @Column({ name: 'pixel_size_source', type: 'text' })
  pixelSizeSource!: string;

  @Column({ name: 'replaced_by', type: 'uuid' })
  replacedBy!: string;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'replaced_by' })
  replacer!: Relation<User>;

  @Column({ name: 'replaced_at', type: 'timestamptz', insert: false, update: false })
  replacedAt!: Date;
}
