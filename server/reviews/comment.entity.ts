import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { User } from '../auth/user.entity';
import { CommentThread } from './comment-thread.entity';

/** One comment in a thread; the first opens it, the rest are replies. */
@Entity({ name: 'comments' })
export class Comment {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'thread_id', type: 'uuid' })
  threadId!: string;

  @ManyToOne(() => CommentThread, (t) => t.comments, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'thread_id' })
  thread!: Relation<CommentThread>;

  @Column({ name: 'author_id', type: 'uuid' })
  authorId!: string;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'author_id' })
  author!: Relation<User>;

  @Column({ type: 'text' })
  body!: string;

  /** User ids of the members mentioned; checked against the project when written. */
  @Column({ type: 'uuid', array: true, default: '{}' })
  mentions!: string[];

  @Column({ name: 'created_at', type: 'timestamptz', insert: false, update: false })
  createdAt!: Date;
}
