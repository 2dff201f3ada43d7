import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { Composition } from '../../shared/archive/composition';

/** An alloy of a project. */
@Entity({ name: 'materials' })
export class Material {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  @Column({ type: 'text' })
  designation!: string;

  @Column({ name: 'material_class', type: 'text', default: '' })
  materialClass!: string;

  @Column({ type: 'jsonb' })
  composition!: Composition;

  @Column({ type: 'text', default: '' })
  notes!: string;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt!: Date;
}
