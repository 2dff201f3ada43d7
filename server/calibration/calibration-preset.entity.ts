import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A microscope set-up (instrument, objective, camera) with a known pixel size. */
@Entity({ name: 'calibration_presets' })
export class CalibrationPreset {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  @Column({ type: 'text' })
  name!: string;

  @Column({ type: 'text', default: '' })
  instrument!: string;

  @Column({ type: 'text', default: '' })
  objective!: string;

  @Column({ type: 'text', default: '' })
  camera!: string;

  @Column({ name: 'um_per_px', type: 'double precision' })
  umPerPx!: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;
}
