import { z } from 'zod';
import { pagingQuery } from './paging';

/** What can happen in a project; the timeline groups and words them. */
export const ACTIVITY_ACTIONS = [
  'project.created',
  'project.updated',
  'member.added',
  'member.changed',
  'member.removed',
  'catalogue.created',
  'catalogue.updated',
  'catalogue.deleted',
  'image.uploaded',
  'image.updated',
  'image.deleted',
  'image.pixel_size_changed',
  'annotation.created',
  'annotation.updated',
  'annotation.deleted',
  'annotations.imported',
  'alignment.saved',
  'alignment.removed',
  'measurement.created',
  'measurement.updated',
  'measurement.deleted',
  'review.state_changed',
  'comment.added',
  'comment.resolved',
  'comment.reopened',
] as const;
export type ActivityAction = (typeof ACTIVITY_ACTIONS)[number];

/** One line of the append-only history. */
export interface ActivityEvent {
  id: string;
  at: string;
  actorName: string;
  action: ActivityAction;
  /** The image it concerns, if any; kept even after the image is deleted. */
  imageId: string | null;
  /** One sentence: "uploaded ARB-3-P1-L_050x.tif", "changed the pixel size from 0.25 to 0.2427 µm/px". */
  summary: string;
}

export const activityQuery = z.strictObject({
  ...pagingQuery,
  dir: z.enum(['asc', 'desc']).default('desc'),
  imageId: z.uuid({ error: 'Not a valid image id.' }).optional(),
});
export type ActivityQuery = z.infer<typeof activityQuery>;
