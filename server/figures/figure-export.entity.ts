import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** One exported file of a figure, at the figure version it was made from. */
@Entity({ name: 'figure_exports' })
export class FigureExport {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'figure_id', type: 'uuid' })
  figureId!: string;

  @Column({ name: 'figure_version', type: 'int' })
  figureVersion!: number;

  @Column({ type: 'text' })
  format!: 'png' | 'tiff';

  @Column({ name: 'width_mm', type: 'double precision' })
  widthMm!: number;

  @Column({ type: 'int' })
  dpi!: number;

  @Column({ name: 'storage_key', type: 'text' })
  storageKey!: string;

  @Column({ name: 'byte_size', type: 'bigint' })
  byteSize!: string;

  @Column({ name: 'created_by', type: 'uuid' })
  createdBy!: string;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;
}
