import type { PersonRef } from '../../../shared/reviews';

/**
 * @mentions in a comment box: finding the name being typed, putting a chosen member in,
 * and working out which chosen members the text still names. Plain functions, no Angular.
 */

/** The "@so" being typed just before the caret: where the @ stands and what follows it. */
export interface MentionQuery {
  /** Index of the @ in the text. */
  start: number;
  /** What was typed after the @, up to the caret. */
  query: string;
}

/** Longest name fragment we keep suggesting for; beyond it the @ is probably not a mention. */
const MAX_QUERY = 40;

/**
 * The mention being typed at `caret`, or null. An @ counts when it starts the text or follows
 * whitespace or an opening bracket (so e-mail addresses do not trigger it), and nothing between it
 * and the caret is a line break. Spaces are allowed, since names have them.
 */
export function mentionQueryAt(text: string, caret: number): MentionQuery | null {
  const before = text.slice(0, Math.max(0, Math.min(caret, text.length)));
  const at = before.lastIndexOf('@');
  if (at < 0) return null;
  if (at > 0 && !/[\s([{]/.test(before[at - 1])) return null;
  const query = before.slice(at + 1);
  if (query.length > MAX_QUERY || /[\n\r@]/.test(query)) return null;
  return { start: at, query };
}

/** Members whose name or e-mail contains every word of `query` (case-insensitive), at most `limit`. */
export function matchMembers<T extends { name: string; email?: string }>(members: readonly T[], query: string, limit = 8): T[] {
  const words = query.toLowerCase().split(/\s+/).filter(Boolean);
  return members
    .filter((m) => {
      const hay = `${m.name} ${m.email ?? ''}`.toLowerCase();
      return words.every((w) => hay.includes(w));
    })
    .slice(0, limit);
}

/** The text with the @query at `mention` replaced by "@Name ", and where the caret goes after it. */
export function insertMention(text: string, mention: MentionQuery, caret: number, name: string): { text: string; caret: number } {
  const inserted = `@${name} `;
  const after = text.slice(Math.max(caret, mention.start + 1 + mention.query.length)).replace(/^ /, '');
  const next = text.slice(0, mention.start) + inserted + after;
  return { text: next, caret: mention.start + inserted.length };
}

/**
 * The ids of chosen people whose "@Name" is still in the text, in the order first chosen and
 * without repeats: deleting a mention from the text also drops the notification.
 */
export function mentionedIds(text: string, chosen: readonly PersonRef[]): string[] {
  const ids: string[] = [];
  for (const person of chosen) {
    // The name must end where the mention ends, so "@Ana" does not match inside "@Anabela Sousa".
    const escaped = person.name.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
    const mention = new RegExp(`@${escaped}(?![\\p{L}\\p{N}_-])`, 'u');
    if (!ids.includes(person.id) && mention.test(text)) ids.push(person.id);
  }
  return ids;
}
