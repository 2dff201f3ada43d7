import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { AnnotationColour, ShapeKind } from '../../shared/annotations/annotations';

/** A kind of feature a project marks on its images (bond interface, oxide chain…), with its colour. */
@Entity({ name: 'annotation_classes' })
export class AnnotationClass {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  @Column({ type: 'text' })
  name!: string;

  @Column({ type: 'text' })
  colour!: AnnotationColour;

  @Column({ name: 'shape_kind', type: 'text' })
  shapeKind!: ShapeKind;

  @Column({ type: 'int', default: 0 })
  position!: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;
}
