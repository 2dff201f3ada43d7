import type { Modality } from '../../../shared/images';
import { apiErrorMessage, type FailedResponse } from '../core/api-error-message';

/**
 * The upload dialog's arithmetic: which fields each file is sent with, how far
 * the batch has got, and what a refusal means. Pure, no Angular.
 */

export type UploadState = 'waiting' | 'queued' | 'uploading' | 'done' | 'duplicate' | 'failed' | 'cancelled';

/** Values that apply to every file of the batch, as the form holds them ('' and null = not given). */
export interface BatchFields {
  specimenId: string;
  locationId: string;
  modality: Modality | '';
  element: string;
  magnification: number | null;
  pixelSizeUm: number | null;
  instrument: string;
  acquiredAt: string;
  tags: string;
  notes: string;
}

/** Per-file choices; '' keeps the batch's value. `NO_LOCATION` files the image on the specimen without a location. */
export interface FileOverrides {
  locationId: string;
  modality: Modality | '';
  element: string;
}

export const NO_LOCATION = 'none';

export const NO_OVERRIDES: FileOverrides = { locationId: '', modality: '', element: '' };

/** The modality a file goes with, after its override. */
export function effectiveModality(batch: Pick<BatchFields, 'modality'>, overrides: FileOverrides): Modality | '' {
  return overrides.modality || batch.modality;
}

/**
 * The multipart text fields for one file: the batch merged with the file's
 * overrides, blanks left out (the server reads a missing field as "not given").
 */
export function uploadFields(batch: BatchFields, overrides: FileOverrides): Record<string, string> {
  const modality = effectiveModality(batch, overrides);
  const location = overrides.locationId === NO_LOCATION ? '' : overrides.locationId || batch.locationId;
  const element = modality === 'eds_element' ? (overrides.element || batch.element).trim() : '';
  const fields: Record<string, string> = {
    specimenId: batch.specimenId,
    locationId: location,
    modality,
    element,
    magnification: batch.magnification === null ? '' : String(batch.magnification),
    pixelSizeUm: batch.pixelSizeUm === null ? '' : String(batch.pixelSizeUm),
    instrument: batch.instrument.trim(),
    acquiredAt: batch.acquiredAt,
    tags: batch.tags.trim(),
    notes: batch.notes.trim(),
  };
  return Object.fromEntries(Object.entries(fields).filter(([, v]) => v !== ''));
}

const STATE_LABELS: Record<UploadState, string> = {
  waiting: 'ready to send',
  queued: 'queued',
  uploading: 'uploading',
  done: 'stored',
  duplicate: 'duplicate',
  failed: 'refused',
  cancelled: 'cancelled',
};

/** The word shown beside a file for its state. */
export function uploadStateLabel(state: UploadState): string {
  return STATE_LABELS[state];
}

/** What the progress bars need of an item. */
export interface ProgressItem {
  size: number;
  state: UploadState;
  /** Bytes sent so far while uploading. */
  loaded: number;
}

/** Percent (0-100) of one file. */
export function fileProgress(item: ProgressItem): number {
  if (item.state === 'done' || item.state === 'duplicate' || item.state === 'failed') return 100;
  if (item.state !== 'uploading' || item.size <= 0) return 0;
  return Math.min(100, Math.round((item.loaded / item.size) * 100));
}

/**
 * Percent (0-100) of the whole batch by bytes: finished files (stored,
 * duplicate or refused) count in full, cancelled ones not at all.
 */
export function overallProgress(items: readonly ProgressItem[]): number {
  const counted = items.filter((i) => i.state !== 'cancelled');
  const total = counted.reduce((sum, i) => sum + Math.max(i.size, 1), 0);
  if (total === 0) return 0;
  const done = counted.reduce((sum, i) => sum + (fileProgress(i) / 100) * Math.max(i.size, 1), 0);
  return Math.min(100, Math.round((done / total) * 100));
}

/** "3 stored, 1 duplicate, 1 refused, 2 to go". */
export function uploadSummary(items: readonly { state: UploadState }[]): string {
  const count = (states: UploadState[]) => items.filter((i) => states.includes(i.state)).length;
  const parts = [
    [count(['done']), 'stored'],
    [count(['duplicate']), count(['duplicate']) === 1 ? 'duplicate' : 'duplicates'],
    [count(['failed']), 'refused'],
    [count(['cancelled']), 'cancelled'],
    [count(['waiting', 'queued', 'uploading']), 'to go'],
  ] as const;
  return parts
    .filter(([n]) => n > 0)
    .map(([n, word]) => `${n} ${word}`)
    .join(', ');
}

/** A refused upload: a duplicate (the same bytes are already filed) or a failure, with the sentence to show beside the file. */
export function uploadFailure(response: FailedResponse): { state: 'duplicate' | 'failed'; message: string } {
  const failure = apiErrorMessage(response);
  const details = Object.values(failure.fieldErrors).filter((m) => !failure.message.includes(m));
  const message = [failure.message, ...details].join(' ');
  return { state: failure.code === 'duplicate_image' ? 'duplicate' : 'failed', message };
}
