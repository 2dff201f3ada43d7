import { HttpClient, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { Modality } from '../../../shared/images';
import type { NotificationSettings, NotificationSettingsBody } from '../../../shared/notifications';
import type { Page } from '../../../shared/paging';
import type {
  CommentBody,
  CommentThread,
  FigureClearance,
  ReviewQueueItem,
  ReviewSnapshot,
  ReviewStatus,
  ReviewSubjectType,
  ReviewTransition,
  ThreadAnchor,
  ThreadStatus,
} from '../../../shared/reviews';
import { moveSegment } from './review-text';

/** What a review or a thread is about: an image or a figure of the project. A plain string is an image id. */
export interface ReviewTarget {
  type: ReviewSubjectType;
  id: string;
}
type Target = ReviewTarget | string;

/** The queue as the page asks for it; filters optional. */
export interface QueueQuery {
  page: number;
  pageSize: number;
  projectId?: string;
  modality?: Modality;
  subjectType?: ReviewSubjectType;
}

/** Reviews and comment threads of images and figures, the reviewer's queue and the caller's notification settings. */
@Injectable({ providedIn: 'root' })
export class ReviewApi {
  private readonly http = inject(HttpClient);

  status(projectId: string, target: Target): Observable<ReviewStatus> {
    return this.http.get<ReviewStatus>(`${this.base(projectId, target)}/review`);
  }

  /** One move; answers with the new status (403 for the wrong role, 409 for the wrong state). */
  move(projectId: string, target: Target, move: ReviewTransition, note: string): Observable<ReviewStatus> {
    return this.http.post<ReviewStatus>(`${this.base(projectId, target)}/review/${moveSegment(move)}`, { note });
  }

  /** What each clearing of an image froze, newest first. */
  snapshots(projectId: string, imageId: string): Observable<ReviewSnapshot[]> {
    return this.http.get<ReviewSnapshot[]>(`${this.base(projectId, { type: 'image', id: imageId })}/review/snapshots`);
  }

  /** What each clearing of a figure froze, with its kept files, newest first. */
  clearances(projectId: string, figureId: string): Observable<FigureClearance[]> {
    return this.http.get<FigureClearance[]>(`${this.base(projectId, { type: 'figure', id: figureId })}/review/clearances`);
  }

  /** Where a kept cleared file downloads from (same origin; the session cookie goes along). */
  clearedFileUrl(projectId: string, figureId: string, clearanceId: string, format: 'png' | 'tiff'): string {
    return `${this.base(projectId, { type: 'figure', id: figureId })}/review/clearances/${encodeURIComponent(clearanceId)}/${format}`;
  }

  threads(projectId: string, target: Target, status: ThreadStatus | 'all'): Observable<CommentThread[]> {
    return this.http.get<CommentThread[]>(`${this.base(projectId, target)}/threads`, { params: { status } });
  }

  /** The anchor kind must fit the target: a point, region or measurement on an image; the whole or a panel on a figure. */
  openThread(projectId: string, target: Target, body: { anchor: ThreadAnchor; body: string; mentions: string[] }): Observable<CommentThread> {
    return this.http.post<CommentThread>(`${this.base(projectId, target)}/threads`, body);
  }

  reply(projectId: string, target: Target, threadId: string, body: CommentBody): Observable<CommentThread> {
    return this.http.post<CommentThread>(`${this.thread(projectId, target, threadId)}/comments`, body);
  }

  resolve(projectId: string, target: Target, threadId: string): Observable<CommentThread> {
    return this.http.post<CommentThread>(`${this.thread(projectId, target, threadId)}/resolve`, {});
  }

  reopenThread(projectId: string, target: Target, threadId: string): Observable<CommentThread> {
    return this.http.post<CommentThread>(`${this.thread(projectId, target, threadId)}/reopen`, {});
  }

  /** Images and figures waiting for the caller's review, oldest submission first. */
  queue(query: QueueQuery): Observable<Page<ReviewQueueItem>> {
    let params = new HttpParams().set('page', query.page).set('pageSize', query.pageSize);
    if (query.projectId) params = params.set('projectId', query.projectId);
    if (query.modality) params = params.set('modality', query.modality);
    if (query.subjectType) params = params.set('subjectType', query.subjectType);
    return this.http.get<Page<ReviewQueueItem>>('/api/review-queue', { params });
  }

  notificationSettings(): Observable<NotificationSettings> {
    return this.http.get<NotificationSettings>('/api/me/notification-settings');
  }

  saveNotificationSettings(body: NotificationSettingsBody): Observable<NotificationSettings> {
    return this.http.put<NotificationSettings>('/api/me/notification-settings', body);
  }

  private base(projectId: string, target: Target): string {
    const { type, id } = typeof target === 'string' ? { type: 'image', id: target } : target;
    return `/api/projects/${encodeURIComponent(projectId)}/${type === 'image' ? 'images' : 'figures'}/${encodeURIComponent(id)}`;
  }

  private thread(projectId: string, target: Target, threadId: string): string {
    return `${this.base(projectId, target)}/threads/${encodeURIComponent(threadId)}`;
  }
}
