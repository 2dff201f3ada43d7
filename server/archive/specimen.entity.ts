import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, OneToMany, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import type { Preparation, SectionPlane } from '../../shared/archive/specimens';
import { RouteStep } from './route-step.entity';
import { Sample } from './sample.entity';
import { SpecimenLocation } from './specimen-location.entity';

/** A piece cut from a sample after a process step, prepared for imaging. */
@Entity({ name: 'specimens' })
export class Specimen {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  @Column({ name: 'sample_id', type: 'uuid' })
  sampleId!: string;

  @ManyToOne(() => Sample)
  @JoinColumn({ name: 'sample_id' })
  sample!: Relation<Sample>;

  @Column({ type: 'text' })
  code!: string;

  @Column({ name: 'after_step_id', type: 'uuid', nullable: true })
  afterStepId!: string | null;

  @ManyToOne(() => RouteStep, { nullable: true })
  @JoinColumn({ name: 'after_step_id' })
  afterStep!: Relation<RouteStep> | null;

  @Column({ name: 'section_plane', type: 'text' })
  sectionPlane!: SectionPlane;

  @Column({ type: 'jsonb' })
  preparation!: Preparation;

  @Column({ type: 'text', default: '' })
  notes!: string;

  @OneToMany(() => SpecimenLocation, (l) => l.specimen)
  locations!: Relation<SpecimenLocation[]>;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt!: Date;
}
