import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';
import type { ActivityEvent } from '../../../shared/activity';
import type { Page } from '../../../shared/paging';

/** The project's (or one image's) append-only history. */
@Injectable({ providedIn: 'root' })
export class ActivityApi {
  private readonly http = inject(HttpClient);

  history(projectId: string, imageId: string | null, pageSize: number): Observable<Page<ActivityEvent>> {
    const params: Record<string, string> = { pageSize: String(pageSize), dir: 'desc' };
    if (imageId) params['imageId'] = imageId;
    return this.http.get<Page<ActivityEvent>>(`/api/projects/${projectId}/activity`, { params });
  }
}
