import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { ClearedFigureFile, ClearedPanelImage } from '../../shared/reviews';
import { User } from '../auth/user.entity';

/** A cleared file as stored: what the client sees, plus where the FileStore keeps it. */
export interface StoredClearedFile extends ClearedFigureFile {
  storageKey: string;
}

/** What a figure was when it was cleared, with the files rendered then; append-only, kept after edits. */
@Entity({ name: 'figure_clearances' })
export class FigureClearance {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'bigint', insert: false, update: false })
  seq!: string;

  @Column({ name: 'figure_id', type: 'uuid' })
  figureId!: string;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  /** The 'clear' event this record belongs to. */
  @Column({ name: 'event_id', type: 'uuid' })
  eventId!: string;

  @Column({ name: 'figure_version', type: 'int' })
  figureVersion!: number;

  @Column({ type: 'text' })
  title!: string;

  /** The figure's stored spec at clearing (layout, print size, panels). */
  @Column({ type: 'jsonb' })
  definition!: Record<string, unknown>;

  @Column({ type: 'jsonb' })
  images!: ClearedPanelImage[];

  @Column({ type: 'jsonb' })
  files!: StoredClearedFile[];

  @Column({ name: 'cleared_by', type: 'uuid' })
  clearedBy!: string;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'cleared_by' })
  clearer!: Relation<User>;

  @Column({ name: 'cleared_at', type: 'timestamptz', insert: false, update: false })
  clearedAt!: Date;
}
