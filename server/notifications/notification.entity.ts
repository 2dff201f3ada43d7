import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { NotificationKind } from '../../shared/notifications';

/** How far a notification got: waiting for the relay or the digest, handed to the mail queue, sent, or dropped (recipient chose off). */
export type NotificationStatus = 'queued' | 'awaiting_digest' | 'mailing' | 'sent' | 'dropped';

/** The facts of the moment a notification describes, kept so the mail reads the same whenever it goes. */
export interface NotificationFacts {
  projectCode: string;
  /** For a notification about an image. */
  imageName?: string;
  /** For a notification about a figure. */
  figureTitle?: string;
  actorName: string;
  /** A reviewer's note, or what changed after clearing. */
  note?: string;
  /** The start of the comment, for mentions and replies. */
  excerpt?: string;
}

/** One thing to tell one person; written in the transaction of the change it tells about. */
@Entity({ name: 'notifications' })
export class Notification {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'recipient_id', type: 'uuid' })
  recipientId!: string;

  @Column({ type: 'text' })
  kind!: NotificationKind;

  @Column({ name: 'project_id', type: 'uuid' })
  projectId!: string;

  /** Exactly one of image and figure is set: what the notification is about. */
  @Column({ name: 'image_id', type: 'uuid', nullable: true })
  imageId!: string | null;

  @Column({ name: 'figure_id', type: 'uuid', nullable: true })
  figureId!: string | null;

  @Column({ name: 'thread_id', type: 'uuid', nullable: true })
  threadId!: string | null;

  @Column({ name: 'actor_id', type: 'uuid' })
  actorId!: string;

  @Column({ type: 'jsonb' })
  facts!: NotificationFacts;

  @Column({ type: 'text' })
  status!: NotificationStatus;

  /** The pg-boss job that carries it while it is being mailed. */
  @Column({ name: 'job_id', type: 'uuid', nullable: true })
  jobId!: string | null;

  @Column({ name: 'created_at', type: 'timestamptz', insert: false, update: false })
  createdAt!: Date;

  @Column({ name: 'sent_at', type: 'timestamptz', nullable: true })
  sentAt!: Date | null;
}
