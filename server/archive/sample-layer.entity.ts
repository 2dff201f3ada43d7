import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import { Material } from './material.entity';
import { Sample } from './sample.entity';

/** One layer of a sample's initial stack; position 0 is the bottom. */
@Entity({ name: 'sample_layers' })
export class SampleLayer {
  @PrimaryColumn({ name: 'sample_id', type: 'uuid' })
  sampleId!: string;

  @PrimaryColumn({ type: 'int' })
  position!: number;

  @ManyToOne(() => Sample, (s) => s.layers, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'sample_id' })
  sample!: Relation<Sample>;

  @Column({ name: 'material_id', type: 'uuid' })
  materialId!: string;

  @ManyToOne(() => Material)
  @JoinColumn({ name: 'material_id' })
  material!: Relation<Material>;

  @Column({ name: 'thickness_mm', type: 'double precision' })
  thicknessMm!: number;
}
