import type { ProjectAction } from './roles';

/**
 * Review states and the moves between them, without zod: screens that only show states (the
 * viewer's comment pins among them) import this, and the schema library stays out of their
 * download. reviews.ts re-exports all of it beside the request schemas.
 */

/** What can be reviewed. Figures follow images; the state table already takes both. */
export const REVIEW_SUBJECT_TYPES = ['image', 'figure'] as const;
export type ReviewSubjectType = (typeof REVIEW_SUBJECT_TYPES)[number];

/** Where a reviewed item stands. An item nobody has submitted yet is a draft. */
export const REVIEW_STATES = ['draft', 'with_reviewers', 'needs_changes', 'cleared'] as const;
export type ReviewState = (typeof REVIEW_STATES)[number];

/** Our names for the states, as people read them. */
export const REVIEW_STATE_LABELS: Record<ReviewState, string> = {
  draft: 'Draft',
  with_reviewers: 'With reviewers',
  needs_changes: 'Needs changes',
  cleared: 'Cleared for publication',
};

/** The moves between states, as the routes name them (…/review/submit, /request-changes, /clear, /reopen). */
export const REVIEW_TRANSITIONS = ['submit', 'requestChanges', 'clear', 'reopen'] as const;
export type ReviewTransition = (typeof REVIEW_TRANSITIONS)[number];

/** Each move: the states it starts from, where it leads, and the permission (shared/roles.ts) it needs. */
export const TRANSITION_RULES: Record<ReviewTransition, { from: readonly ReviewState[]; to: ReviewState; action: ProjectAction; label: string }> = {
  submit: { from: ['draft', 'needs_changes'], to: 'with_reviewers', action: 'submitForReview', label: 'Submit for review' },
  requestChanges: { from: ['with_reviewers'], to: 'needs_changes', action: 'decideReview', label: 'Request changes' },
  clear: { from: ['with_reviewers'], to: 'cleared', action: 'decideReview', label: 'Clear for publication' },
  reopen: { from: ['cleared'], to: 'draft', action: 'reopenReview', label: 'Reopen' },
};

/** How a state reads inside a sentence: "this one is …". */
const STATE_PHRASES: Record<ReviewState, string> = {
  draft: 'a draft',
  with_reviewers: 'with reviewers',
  needs_changes: 'waiting for changes',
  cleared: 'already cleared for publication',
};

/** Why `transition` cannot start from `state` (a sentence to show), or null when it can. */
export function transitionProblem(transition: ReviewTransition, state: ReviewState): string | null {
  if (TRANSITION_RULES[transition].from.includes(state)) return null;
  const now = `this one is ${STATE_PHRASES[state]}`;
  switch (transition) {
    case 'submit':
      return state === 'cleared'
        ? 'This is already cleared for publication; a lead reopens it before it can be submitted again.'
        : 'This is already with reviewers; wait for their decision.';
    case 'requestChanges':
      return `Only an item with reviewers can be sent back for changes; ${now}.`;
    case 'clear':
      return `Only an item with reviewers can be cleared; ${now}.`;
    case 'reopen':
      return `Only a cleared item can be reopened; ${now}.`;
  }
}

/** The moves a caller with `allowed` actions can make from `state`. */
export function availableTransitions(state: ReviewState, allowed: readonly ProjectAction[]): ReviewTransition[] {
  return REVIEW_TRANSITIONS.filter((t) => TRANSITION_RULES[t].from.includes(state) && allowed.includes(TRANSITION_RULES[t].action));
}
