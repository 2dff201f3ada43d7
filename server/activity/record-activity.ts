import type { EntityManager } from 'typeorm';
import type { ActivityAction } from '../../shared/activity';
import { ActivityEvent } from './activity-event.entity';

export interface ActivityInput {
  projectId: string;
  actorId: string;
  action: ActivityAction;
  summary: string;
  imageId?: string | null;
  details?: Record<string, unknown>;
}

/**
 * Appends to the history. Pass the manager of the transaction that made the change,
 * so the change and its record commit or roll back together.
 */
export async function recordActivity(m: EntityManager, input: ActivityInput): Promise<void> {
  await m.save(m.create(ActivityEvent, { ...input, imageId: input.imageId ?? null, details: input.details ?? {} }));
}
