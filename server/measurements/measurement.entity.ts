import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { MeasurementResult, TestPath } from '../../shared/measurements/measurement-records';
import type { MeasurementBody, MeasurementKind } from '../../shared/measurements/measurements';
import type { TestLine } from '../../shared/measurements/patterns';
import { User } from '../auth/user.entity';
import { Image } from '../images/image.entity';
import type { FieldFrame } from './field-geometry';
import type { MeasurementSources } from './measurement-sources';

/** What a result was counted on, besides the definition: the frame, and the pattern or grid as laid in px. */
export interface MeasurementLayout extends Omit<FieldFrame, 'where' | 'umPerPx'> {
  regionLabel: string;
  /** Test lines as laid (before clipping), image px. */
  laid: TestLine[];
  /** Grid spacing as laid, image px (point counts). */
  gridSpacingPx: number | null;
  /** What was counted at the last compute (clipped test lines, grid points in the region), for drawing it again. */
  counted: { testLines: TestPath[]; grid: [number, number][] };
  /** The annotations (ids and versions) and point count the result used; absent on rows saved before they were recorded. */
  sources?: MeasurementSources;
}

/** One measured field; `version` guards against silent overwrites, the history keeps what it replaced. */
@Entity({ name: 'measurements' })
export class Measurement {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  @Column({ name: 'image_id', type: 'uuid' })
  imageId!: string;

  @ManyToOne(() => Image, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'image_id' })
  image!: Relation<Image>;

  @Column({ type: 'text' })
  kind!: MeasurementKind;

  @Column({ type: 'jsonb' })
  definition!: MeasurementBody;

  @Column({ type: 'jsonb' })
  layout!: MeasurementLayout;

  @Column({ type: 'jsonb' })
  result!: MeasurementResult;

  @Column({ name: 'where_label', type: 'text' })
  whereLabel!: string;

  @Column({ name: 'um_per_px', type: 'double precision' })
  umPerPx!: number;

  @Column({ name: 'pixel_size_source', type: 'text' })
  pixelSizeSource!: string;

  @Column({ name: 'author_id', type: 'uuid' })
  authorId!: string;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'author_id' })
  author!: Relation<User>;

  @Column({ name: 'updated_by', type: 'uuid' })
  updatedBy!: string;

  @Column({ type: 'int', default: 1 })
  version!: number;

  @Column({ name: 'created_at', type: 'timestamptz', default: () => 'now()' })
  createdAt!: Date;

  @Column({ name: 'updated_at', type: 'timestamptz', default: () => 'now()' })
  updatedAt!: Date;

  @Column({ name: 'computed_at', type: 'timestamptz', default: () => 'now()' })
  computedAt!: Date;
}
