import { z } from 'zod';
import type { Annotation } from './annotations/annotations';
import { MODALITIES, type Modality, type PixelSizeInfo } from './images';
import { pagingQuery } from './paging';
import type { ProjectAction } from './roles';

export {
  availableTransitions,
  REVIEW_STATE_LABELS,
  REVIEW_STATES,
  REVIEW_SUBJECT_TYPES,
  REVIEW_TRANSITIONS,
  TRANSITION_RULES,
  transitionProblem,
  type ReviewState,
  type ReviewSubjectType,
  type ReviewTransition,
} from './review-states';
import { REVIEW_SUBJECT_TYPES, type ReviewState, type ReviewSubjectType, type ReviewTransition } from './review-states';

/** A person as the review screens show them. */
export interface PersonRef {
  id: string;
  name: string;
}

/** One step of an item's review history. `reason` 'edited' is the automatic return to draft after a change. */
export interface ReviewEvent {
  id: string;
  from: ReviewState;
  to: ReviewState;
  reason: ReviewTransition | 'edited';
  actor: PersonRef;
  note: string;
  at: string;
}

/** GET …/images/:imageId/review and …/figures/:figureId/review */
export interface ReviewStatus {
  subjectType: ReviewSubjectType;
  subjectId: string;
  state: ReviewState;
  stateLabel: string;
  submittedBy: PersonRef | null;
  submittedAt: string | null;
  /** Threads still open on the item; clearing needs none. */
  openThreads: number;
  /** What the caller may do now, from the state and their role. */
  transitions: ReviewTransition[];
  /** Oldest first. */
  history: ReviewEvent[];
}

/** A measurement as it stood when cleared; `definition` and `result` are the stored records (shared/measurements). */
export interface SnapshotMeasurement {
  id: string;
  kind: string;
  whereLabel: string;
  umPerPx: number;
  pixelSizeSource: string;
  version: number;
  definition: Record<string, unknown>;
  result: Record<string, unknown>;
  computedAt: string;
}

/** What was reviewed, frozen at the moment it was cleared; kept whatever happens to the image later. */
export interface ReviewSnapshot {
  id: string;
  subjectId: string;
  clearedBy: PersonRef;
  clearedAt: string;
  pixelSize: PixelSizeInfo;
  annotations: Annotation[];
  measurements: SnapshotMeasurement[];
}

const note = z.string().trim().max(2000, { error: 'Keep the note under 2000 characters.' }).default('');

/** Body of every review move: an optional note (why changes are needed, what was checked). */
export const reviewTransitionBody = z.strictObject({ note });
export type ReviewTransitionBody = z.infer<typeof reviewTransitionBody>;

/** One file rendered when a figure was cleared, kept unchanged under its SHA-256. */
export interface ClearedFigureFile {
  format: 'png' | 'tiff';
  widthMm: number;
  dpi: number;
  /** Pixels of the rendered file. */
  width: number;
  height: number;
  byteSize: number;
  sha256: string;
}

/** What a panel's image was when its figure was cleared. */
export interface ClearedPanelImage {
  imageId: string;
  name: string;
  /** µm per px at clearing; null for an uncalibrated image. */
  pixelSizeUm: number | null;
  /** Annotations of the classes the figure shows on this image. */
  annotationsShown: number;
}

/** A figure as it was cleared: its definition, its panels' images, and the export files rendered then. */
export interface FigureClearance {
  id: string;
  figureId: string;
  /** The figure version that was cleared. */
  figureVersion: number;
  title: string;
  definition: Record<string, unknown>;
  images: ClearedPanelImage[];
  files: ClearedFigureFile[];
  clearedBy: PersonRef;
  clearedAt: string;
}

/** A row of a reviewer's queue: an image or a figure waiting for them. */
export interface ReviewQueueItem {
  subjectType: ReviewSubjectType;
  subjectId: string;
  /** The image's file name or the figure's title. */
  name: string;
  projectId: string;
  projectCode: string;
  /** Images only (null for figures). */
  modality: Modality | null;
  /** Images only (null for figures). */
  specimenCode: string | null;
  /** Figures only (null for images). */
  panelCount: number | null;
  submittedBy: PersonRef;
  submittedAt: string;
  openThreads: number;
}

/** A repeated or comma-separated query field as a list. */
const optionalList = <T extends z.ZodType>(item: T, max: number) =>
  z.preprocess((v) => (v === undefined ? undefined : (Array.isArray(v) ? v : [v]).flatMap((s) => String(s).split(',')).map((s) => s.trim()).filter(Boolean)), z.array(item).max(max, { error: `Ask for at most ${max} at once.` }).optional());

/** GET /api/review-queue: oldest submission first; every filter optional. */
export const reviewQueueQuery = z.strictObject({
  page: pagingQuery.page,
  pageSize: pagingQuery.pageSize,
  projectId: z.uuid({ error: 'Not a valid project id.' }).optional(),
  modality: optionalList(z.enum(MODALITIES, { error: 'Unknown modality.' }), MODALITIES.length),
  /** Only images or only figures; a modality filter leaves figures out, as they have none. */
  subjectType: z.enum(REVIEW_SUBJECT_TYPES, { error: 'Ask for images or figures.' }).optional(),
  submitterId: z.uuid({ error: 'Not a valid user id.' }).optional(),
});
export type ReviewQueueQuery = z.infer<typeof reviewQueueQuery>;

// ---- Comment threads pinned to an image ----

export const THREAD_STATUSES = ['open', 'resolved'] as const;
export type ThreadStatus = (typeof THREAD_STATUSES)[number];

const px = z.number({ error: 'Give coordinates in image pixels.' }).finite();
const position = z.tuple([px, px]);

/** Where a thread is pinned: a point, a drawn region (a ring of image px, not closed by a repeat) or a measurement. */
export const threadAnchor = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('point'), at: position }),
    z.strictObject({ kind: z.literal('region'), ring: z.array(position).min(3, { error: 'A region needs at least three points.' }).max(5000, { error: 'A region may have at most 5000 points.' }) }),
    z.strictObject({ kind: z.literal('measurement'), measurementId: z.uuid({ error: 'Not a valid measurement id.' }) }),
  ],
  { error: 'Pin the thread to a point, a region or a measurement.' },
);
export type ImageThreadAnchor = z.infer<typeof threadAnchor>;

/** Where a thread on a figure is pinned: the figure as a whole, or one panel (by its place, 0 for the first). */
export const figureThreadAnchor = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('figure') }),
    z.strictObject({ kind: z.literal('panel'), panel: z.number({ error: 'Give the panel by its place, 0 for the first.' }).int().min(0).max(23) }),
  ],
  { error: 'Pin the thread to the figure or to one of its panels.' },
);
export type FigureThreadAnchor = z.infer<typeof figureThreadAnchor>;

/** Any thread's pin: on an image, or on a figure. */
export type ThreadAnchor = ImageThreadAnchor | FigureThreadAnchor;

const commentText = z
  .string({ error: 'Write a comment.' })
  .trim()
  .min(1, { error: 'Write a comment; it is empty.' })
  .max(5000, { error: 'Keep a comment under 5000 characters.' });

/** Members to notify, as user ids chosen from the project's members (the client autocompletes names). */
const mentions = z
  .array(z.uuid({ error: 'Mention people by their user id.' }))
  .max(20, { error: 'Mention at most 20 people in one comment.' })
  .default([])
  .transform((ids) => [...new Set(ids)]);

/** POST …/images/:imageId/threads: where to pin it, the first comment, and who to mention. */
export const newThreadBody = z.strictObject({ anchor: threadAnchor, body: commentText, mentions });
export type NewThreadBody = z.infer<typeof newThreadBody>;

/** POST …/figures/:figureId/threads: the same, pinned to the figure or one of its panels. */
export const newFigureThreadBody = z.strictObject({ anchor: figureThreadAnchor, body: commentText, mentions });
export type NewFigureThreadBody = z.infer<typeof newFigureThreadBody>;

/** POST …/threads/:threadId/comments: a reply. */
export const commentBody = z.strictObject({ body: commentText, mentions });
export type CommentBody = z.infer<typeof commentBody>;

/** GET …/images/:imageId/threads: all threads, or only open or resolved ones. */
export const threadListQuery = z.strictObject({ status: z.enum([...THREAD_STATUSES, 'all']).default('all') });
export type ThreadListQuery = z.infer<typeof threadListQuery>;

/** One comment of a thread, with the members it mentions by name. */
export interface ThreadComment {
  id: string;
  threadId: string;
  author: PersonRef;
  body: string;
  mentions: PersonRef[];
  createdAt: string;
}

/** A thread pinned to an image or a figure, with all its comments. */
export interface CommentThread {
  id: string;
  projectId: string;
  /** Set for a thread on an image; null on a figure. */
  imageId: string | null;
  /** Set for a thread on a figure; null on an image. */
  figureId: string | null;
  anchor: ThreadAnchor;
  /** False once the measurement it was pinned to is deleted; the thread and its anchor stay. */
  anchorPresent: boolean;
  status: ThreadStatus;
  createdBy: PersonRef;
  createdAt: string;
  resolvedBy: PersonRef | null;
  resolvedAt: string | null;
  /** The first comment opens the thread; the rest are replies, oldest first. */
  comments: ThreadComment[];
}

/** GET …/comment-counts: open threads in the project, and per image (images without open threads are left out). */
export interface CommentCounts {
  projectId: string;
  unresolved: number;
  images: Record<string, number>;
}

/** GET …/comment-counts: optionally only for these images (repeated or comma-separated ids). */
export const commentCountsQuery = z.strictObject({
  imageId: optionalList(z.uuid({ error: 'Not a valid image id.' }), 200),
});
export type CommentCountsQuery = z.infer<typeof commentCountsQuery>;
