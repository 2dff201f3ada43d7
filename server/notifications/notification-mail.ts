import { notificationPath, type NotificationKind } from '../../shared/notifications';
import type { NotificationFacts } from './notification.entity';

/** What the mail composer needs of a stored notification. */
export interface MailableNotification {
  kind: NotificationKind;
  projectId: string;
  imageId: string | null;
  figureId: string | null;
  threadId: string | null;
  facts: NotificationFacts;
}

/** Subject and body of a message, without the recipient. */
export interface ComposedMail {
  subject: string;
  text: string;
}

/** A digest lists at most this many lines; the rest are counted, and the app shows them all. */
const DIGEST_LINES = 100;

const SETTINGS_HINT = 'You can choose immediate e-mail, a daily digest or no e-mail in Etchfile under your notification settings.';

/** What the notification is about, as a sentence names it: the image's file name, or "the figure “…”". */
function subjectName(n: MailableNotification): string {
  return n.figureId ? `the figure “${n.facts.figureTitle ?? ''}”` : (n.facts.imageName ?? 'an image');
}

/** One sentence saying what happened, as a subject line and a digest line read it. */
function headline(n: MailableNotification): string {
  const { actorName: who } = n.facts;
  const image = subjectName(n);
  switch (n.kind) {
    case 'review_requested':
      return `${who} submitted ${image} for review`;
    case 'mention':
      return `${who} mentioned you on ${image}`;
    case 'changes_requested':
      return `${who} asked for changes to ${image}`;
    case 'cleared':
      return `${who} cleared ${image} for publication`;
    case 'reply':
      return `${who} replied in a thread on ${image}`;
    case 'returned_to_draft':
      return n.figureId ? `The figure “${n.facts.figureTitle ?? ''}” is back to draft` : `${image} is back to draft`;
  }
}

/** The paragraph under the headline: what to do, with the note or comment it carries. */
function detail(n: MailableNotification): string {
  const { actorName: who, note, excerpt } = n.facts;
  const quoted = excerpt ? `\n\n  “${excerpt}”` : '';
  const noted = note ? `\n\nNote: ${note}` : '';
  switch (n.kind) {
    case 'review_requested':
      return `It is waiting in your review queue.${noted}`;
    case 'mention':
    case 'reply':
      return `${who} wrote:${quoted}`;
    case 'changes_requested':
      return `Make the changes, then submit it again.${noted}`;
    case 'cleared':
      return n.figureId
        ? `The export rendered at clearing (PNG and TIFF) is kept unchanged and can be downloaded from the figure's page.${noted}`
        : `What was cleared (pixel size, annotations and measurements) is kept as a snapshot.${noted}`;
    case 'returned_to_draft':
      return `It was cleared for publication; ${who} ${note ?? 'changed it'}, so it needs a new review before it is published.`;
  }
}

function link(publicUrl: string, n: MailableNotification): string {
  return publicUrl.replace(/\/+$/, '') + notificationPath(n.projectId, { imageId: n.imageId, figureId: n.figureId }, n.threadId);
}

/** One notification as its own message, linking to the image or figure (and the thread, when there is one). */
export function composeSingle(n: MailableNotification, recipientName: string, publicUrl: string): ComposedMail {
  return {
    subject: `[${n.facts.projectCode}] ${headline(n)}`,
    text: `Hello ${recipientName},\n\n${headline(n)}.\n\n${detail(n)}\n\nOpen it: ${link(publicUrl, n)}\n\n-- \n${SETTINGS_HINT}\n`,
  };
}

/** A day's notifications in one message, grouped by project, each line with its link. */
export function composeDigest(items: readonly MailableNotification[], recipientName: string, publicUrl: string): ComposedMail {
  const shown = items.slice(0, DIGEST_LINES);
  const byProject = new Map<string, MailableNotification[]>();
  for (const n of shown) byProject.set(n.facts.projectCode, [...(byProject.get(n.facts.projectCode) ?? []), n]);
  const sections = [...byProject].map(([code, list]) => `${code}\n${list.map((n) => `- ${headline(n)}${n.facts.excerpt ? `: “${n.facts.excerpt}”` : ''}\n  ${link(publicUrl, n)}`).join('\n')}`);
  const more = items.length > shown.length ? `\n\n…and ${items.length - shown.length} more; open Etchfile to see them all.` : '';
  const count = `${items.length} notification${items.length === 1 ? '' : 's'}`;
  return {
    subject: `Etchfile daily digest: ${count}`,
    text: `Hello ${recipientName},\n\nHere is what happened since your last digest (${count}).\n\n${sections.join('\n\n')}${more}\n\n-- \n${SETTINGS_HINT}\n`,
  };
}
