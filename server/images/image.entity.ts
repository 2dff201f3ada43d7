import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { ImageFormat, Modality, ProcessingState } from '../../shared/images';
import type { PixelSizeSource } from '../../shared/pixel-size';
import { SpecimenLocation } from '../archive/specimen-location.entity';
import { Specimen } from '../archive/specimen.entity';
import { User } from '../auth/user.entity';

/** A micrograph: the original kept byte for byte, what was read from it, and the state of its derivatives. */
@Entity({ name: 'images' })
export class Image {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  @Column({ name: 'specimen_id', type: 'uuid' })
  specimenId!: string;

  @ManyToOne(() => Specimen)
  @JoinColumn({ name: 'specimen_id' })
  specimen!: Relation<Specimen>;

  @Column({ name: 'location_id', type: 'uuid', nullable: true })
  locationId!: string | null;

  @ManyToOne(() => SpecimenLocation, { nullable: true })
  @JoinColumn({ name: 'location_id' })
  location!: Relation<SpecimenLocation> | null;

  @Column({ name: 'uploader_id', type: 'uuid' })
  uploaderId!: string;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'uploader_id' })
  uploader!: Relation<User>;

  @Column({ type: 'text' })
  modality!: Modality;

  @Column({ type: 'text', nullable: true })
  element!: string | null;

  @Column({ type: 'text', default: '' })
  instrument!: string;

  @Column({ type: 'double precision', nullable: true })
  magnification!: number | null;

  @Column({ name: 'accelerating_voltage_kv', type: 'double precision', nullable: true })
  acceleratingVoltageKv!: number | null;

  @Column({ name: 'working_distance_mm', type: 'double precision', nullable: true })
  workingDistanceMm!: number | null;

  @Column({ type: 'text', default: '' })
  detector!: string;

  @Column({ name: 'acquired_at', type: 'timestamptz', nullable: true })
  acquiredAt!: Date | null;

  @Column({ name: 'pixel_size_um', type: 'double precision', nullable: true })
  pixelSizeUm!: number | null;

  @Column({ name: 'pixel_size_y_um', type: 'double precision', nullable: true })
  pixelSizeYUm!: number | null;

  @Column({ name: 'pixel_size_source', type: 'text', default: 'none' })
  pixelSizeSource!: PixelSizeSource;

  @Column({ name: 'pixel_size_confirmed', type: 'boolean', default: false })
  pixelSizeConfirmed!: boolean;

  @Column({ name: 'pixel_size_note', type: 'text', default: '' })
  pixelSizeNote!: string;

  @Column({ type: 'text', array: true, default: '{}' })
  tags!: string[];

  @Column({ type: 'text', default: '' })
  notes!: string;

  @Column({ name: 'original_name', type: 'text' })
  originalName!: string;

  @Column({ type: 'char', length: 64 })
  sha256!: string;

  /** bigint: pg returns it as a string; the mapper turns it into a number (files stay far below 2^53 bytes). */
  @Column({ name: 'byte_size', type: 'bigint' })
  byteSize!: string;

  @Column({ type: 'text' })
  format!: ImageFormat;

  @Column({ type: 'int' })
  width!: number;

  @Column({ type: 'int' })
  height!: number;

  @Column({ name: 'bit_depth', type: 'int' })
  bitDepth!: number;

  @Column({ type: 'int' })
  channels!: number;

  @Column({ name: 'page_count', type: 'int', default: 1 })
  pageCount!: number;

  @Column({ name: 'original_key', type: 'text' })
  originalKey!: string;

  @Column({ type: 'text', default: 'queued' })
  state!: ProcessingState;

  @Column({ type: 'int', default: 0 })
  progress!: number;

  @Column({ name: 'failure_reason', type: 'text', nullable: true })
  failureReason!: string | null;

  @Column({ type: 'int', default: 0 })
  attempts!: number;

  @Column({ name: 'pyramid_levels', type: 'int', nullable: true })
  pyramidLevels!: number | null;

  @Column({ name: 'uploaded_at', type: 'timestamptz', default: () => 'now()' })
  uploadedAt!: Date;

  @Column({ name: 'updated_at', type: 'timestamptz', default: () => 'now()' })
  updatedAt!: Date;
}
