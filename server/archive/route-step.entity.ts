import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { StepParams, StepType } from '../../shared/archive/process-route';
import { Sample } from './sample.entity';

/** One step of a sample's process route; specimens point at the step after which they were cut. */
@Entity({ name: 'route_steps' })
export class RouteStep {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'sample_id', type: 'uuid' })
  sampleId!: string;

  @ManyToOne(() => Sample, (s) => s.steps, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'sample_id' })
  sample!: Relation<Sample>;

  @Column({ type: 'int' })
  position!: number;

  @Column({ type: 'text' })
  type!: StepType;

  /** A calendar date; pg returns it as the string yyyy-mm-dd. */
  @Column({ type: 'date', nullable: true })
  date!: string | null;

  @Column({ type: 'jsonb', default: {} })
  params!: StepParams;

  @Column({ type: 'text', default: '' })
  notes!: string;
}
