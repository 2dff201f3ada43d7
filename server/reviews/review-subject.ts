import type { EntityManager } from 'typeorm';
import type { ReviewSubjectType } from '../../shared/reviews';
import { AppError } from '../http/app-error';

/** What a review, a thread or a notification is about: an image or a figure, by id. */
export interface ReviewSubject {
  type: ReviewSubjectType;
  id: string;
}

/** The column naming the subject in review_states, comment_threads and notifications. */
export function subjectColumn(subject: ReviewSubject): 'image_id' | 'figure_id' {
  return subject.type === 'image' ? 'image_id' : 'figure_id';
}

/** "image" or "figure", as sentences say it. */
export function subjectWord(subject: ReviewSubject): string {
  return subject.type;
}

/** The subject must belong to the project; otherwise 404 (strangers' ids look the same as missing ones). */
export async function requireSubject(m: EntityManager, projectId: string, subject: ReviewSubject): Promise<void> {
  const table = subject.type === 'image' ? 'images' : 'figures';
  const found: unknown[] = await m.query(`SELECT 1 FROM ${table} WHERE id = $1 AND project_id = $2`, [subject.id, projectId]);
  if (found.length === 0) throw AppError.notFound(subject.type === 'image' ? 'The image' : 'The figure');
}
