import { z } from 'zod';

/** What the app tells people about by e-mail. */
export const NOTIFICATION_KINDS = ['review_requested', 'mention', 'changes_requested', 'cleared', 'reply', 'returned_to_draft'] as const;
export type NotificationKind = (typeof NOTIFICATION_KINDS)[number];

/** How each kind reads in settings and in digests. */
export const NOTIFICATION_KIND_LABELS: Record<NotificationKind, string> = {
  review_requested: 'An image or figure is submitted for your review',
  mention: 'Someone mentions you in a comment',
  changes_requested: 'A reviewer asks for changes to your submission',
  cleared: 'Your submission is cleared for publication',
  reply: 'Someone replies in a thread you are in',
  returned_to_draft: 'A cleared image or figure you were involved in is back to draft',
};

/** How a person wants their notifications: each as it happens, all of a day in one mail, or none. */
export const DELIVERY_MODES = ['immediate', 'daily', 'off'] as const;
export type DeliveryMode = (typeof DELIVERY_MODES)[number];

/** How each mode reads in the settings form. */
export const DELIVERY_MODE_LABELS: Record<DeliveryMode, string> = {
  immediate: 'Each one as it happens',
  daily: 'One daily digest',
  off: 'No e-mail',
};

/** GET/PUT /api/me/notification-settings */
export interface NotificationSettings {
  delivery: DeliveryMode;
  /** When the daily digest goes out, as an hour of the day in UTC. */
  digestHourUtc: number;
  /** Null until the person first chooses (immediate applies until then). */
  updatedAt: string | null;
}

/** PUT /api/me/notification-settings */
export const notificationSettingsBody = z.strictObject({
  delivery: z.enum(DELIVERY_MODES, { error: 'Choose immediate, daily or off.' }),
});
export type NotificationSettingsBody = z.infer<typeof notificationSettingsBody>;

/** What a notification is about: an image or a figure of the project. */
export interface NotificationTarget {
  imageId: string | null;
  figureId: string | null;
}

/**
 * The page a notification points at: the image's page, where its review and threads are (the viewer
 * is one click from there), or the figure's page; opened on the thread when there is one.
 * Relative, so the server can prefix its public address when it sends.
 */
export function notificationPath(projectId: string, target: NotificationTarget, threadId: string | null): string {
  const base = target.figureId ? `/projects/${projectId}/figures/${target.figureId}` : `/projects/${projectId}/images/${target.imageId}`;
  return threadId ? `${base}?thread=${threadId}` : base;
}
