import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Specimen } from './specimen.entity';

/** A named place on a specimen ("interface 2, centre"), optionally with a position in mm. */
@Entity({ name: 'specimen_locations' })
export class SpecimenLocation {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'specimen_id', type: 'uuid' })
  specimenId!: string;

  @ManyToOne(() => Specimen, (s) => s.locations, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'specimen_id' })
  specimen!: Relation<Specimen>;

  @Column({ type: 'text' })
  name!: string;

  @Column({ name: 'x_mm', type: 'double precision', nullable: true })
  xMm!: number | null;

  @Column({ name: 'y_mm', type: 'double precision', nullable: true })
  yMm!: number | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;
}
