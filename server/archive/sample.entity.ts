import { Column, CreateDateColumn, Entity, OneToMany, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import { RouteStep } from './route-step.entity';
import { SampleLayer } from './sample-layer.entity';

/** One plate or laminate: its initial layer stack and its process route. */
@Entity({ name: 'samples' })
export class Sample {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  @Column({ type: 'text' })
  code!: string;

  @Column({ type: 'text' })
  name!: string;

  @Column({ type: 'text', default: '' })
  description!: string;

  @OneToMany(() => SampleLayer, (l) => l.sample)
  layers!: Relation<SampleLayer[]>;

  @OneToMany(() => RouteStep, (s) => s.sample)
  steps!: Relation<RouteStep[]>;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt!: Date;
}
