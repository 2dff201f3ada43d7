import { HttpClient, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { Modality } from '../../../shared/images';
import type { NotificationSettings, NotificationSettingsBody } from '../../../shared/notifications';
import type { Page } from '../../../shared/paging';
import type {
  CommentBody,
  CommentThread,
  NewThreadBody,
  ReviewQueueItem,
  ReviewSnapshot,
  ReviewStatus,
  ReviewTransition,
  ThreadStatus,
} from '../../../shared/reviews';
import { moveSegment } from './review-text';

/** The queue as the page asks for it; filters optional. */
export interface QueueQuery {
  page: number;
  pageSize: number;
  projectId?: string;
  modality?: Modality;
}

/** Reviews, comment threads, the reviewer's queue and the caller's notification settings. */
@Injectable({ providedIn: 'root' })
export class ReviewApi {
  private readonly http = inject(HttpClient);

  status(projectId: string, imageId: string): Observable<ReviewStatus> {
    return this.http.get<ReviewStatus>(`${this.image(projectId, imageId)}/review`);
  }

  /** One move; answers with the new status (403 for the wrong role, 409 for the wrong state). */
  move(projectId: string, imageId: string, move: ReviewTransition, note: string): Observable<ReviewStatus> {
    return this.http.post<ReviewStatus>(`${this.image(projectId, imageId)}/review/${moveSegment(move)}`, { note });
  }

  snapshots(projectId: string, imageId: string): Observable<ReviewSnapshot[]> {
    return this.http.get<ReviewSnapshot[]>(`${this.image(projectId, imageId)}/review/snapshots`);
  }

  threads(projectId: string, imageId: string, status: ThreadStatus | 'all'): Observable<CommentThread[]> {
    return this.http.get<CommentThread[]>(`${this.image(projectId, imageId)}/threads`, { params: { status } });
  }

  openThread(projectId: string, imageId: string, body: NewThreadBody): Observable<CommentThread> {
    return this.http.post<CommentThread>(`${this.image(projectId, imageId)}/threads`, body);
  }

  reply(projectId: string, imageId: string, threadId: string, body: CommentBody): Observable<CommentThread> {
    return this.http.post<CommentThread>(`${this.thread(projectId, imageId, threadId)}/comments`, body);
  }

  resolve(projectId: string, imageId: string, threadId: string): Observable<CommentThread> {
    return this.http.post<CommentThread>(`${this.thread(projectId, imageId, threadId)}/resolve`, {});
  }

  reopenThread(projectId: string, imageId: string, threadId: string): Observable<CommentThread> {
    return this.http.post<CommentThread>(`${this.thread(projectId, imageId, threadId)}/reopen`, {});
  }

  /** Images waiting for the caller's review, oldest submission first. */
  queue(query: QueueQuery): Observable<Page<ReviewQueueItem>> {
    let params = new HttpParams().set('page', query.page).set('pageSize', query.pageSize);
    if (query.projectId) params = params.set('projectId', query.projectId);
    if (query.modality) params = params.set('modality', query.modality);
    return this.http.get<Page<ReviewQueueItem>>('/api/review-queue', { params });
  }

  notificationSettings(): Observable<NotificationSettings> {
    return this.http.get<NotificationSettings>('/api/me/notification-settings');
  }

  saveNotificationSettings(body: NotificationSettingsBody): Observable<NotificationSettings> {
    return this.http.put<NotificationSettings>('/api/me/notification-settings', body);
  }

  private image(projectId: string, imageId: string): string {
    return `/api/projects/${encodeURIComponent(projectId)}/images/${encodeURIComponent(imageId)}`;
  }

  private thread(projectId: string, imageId: string, threadId: string): string {
    return `${this.image(projectId, imageId)}/threads/${encodeURIComponent(threadId)}`;
  }
}
