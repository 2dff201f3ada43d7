import { HttpClient, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { Page } from '../../../shared/paging';
import type {
  AddMemberBody,
  ChangeMemberBody,
  CreateProjectBody,
  ListProjectsQuery,
  ProjectDetail,
  ProjectMember,
  ProjectSummary,
  UpdateProjectBody,
} from '../../../shared/projects';

/** Everything the projects pages ask of the server. */
@Injectable({ providedIn: 'root' })
export class ProjectApi {
  private readonly http = inject(HttpClient);

  /** One page, sorted and filtered by the server. */
  list(query: ListProjectsQuery): Observable<Page<ProjectSummary>> {
    const params = new HttpParams({ fromObject: { ...query } });
    return this.http.get<Page<ProjectSummary>>('/api/projects', { params });
  }

  create(body: CreateProjectBody): Observable<ProjectDetail> {
    return this.http.post<ProjectDetail>('/api/projects', body);
  }

  get(projectId: string): Observable<ProjectDetail> {
    return this.http.get<ProjectDetail>(`/api/projects/${encodeURIComponent(projectId)}`);
  }

  update(projectId: string, body: UpdateProjectBody): Observable<ProjectDetail> {
    return this.http.patch<ProjectDetail>(`/api/projects/${encodeURIComponent(projectId)}`, body);
  }

  addMember(projectId: string, body: AddMemberBody): Observable<ProjectMember> {
    return this.http.post<ProjectMember>(`/api/projects/${encodeURIComponent(projectId)}/members`, body);
  }

  changeMember(projectId: string, userId: string, body: ChangeMemberBody): Observable<ProjectMember> {
    return this.http.patch<ProjectMember>(this.memberUrl(projectId, userId), body);
  }

  removeMember(projectId: string, userId: string): Observable<void> {
    return this.http.delete<void>(this.memberUrl(projectId, userId));
  }

  private memberUrl(projectId: string, userId: string): string {
    return `/api/projects/${encodeURIComponent(projectId)}/members/${encodeURIComponent(userId)}`;
  }
}
