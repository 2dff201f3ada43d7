import { HttpClient, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { InviteUserBody, KeptMail, ListUsersQuery, UpdateUserBody, UserSummary } from '../../../shared/admin';
import type { Page } from '../../../shared/paging';

/** Site administration: accounts, and the local mail outbox. */
@Injectable({ providedIn: 'root' })
export class AdminApi {
  private readonly http = inject(HttpClient);

  listUsers(query: ListUsersQuery): Observable<Page<UserSummary>> {
    const params = new HttpParams({ fromObject: { ...query } });
    return this.http.get<Page<UserSummary>>('/api/admin/users', { params });
  }

  /** Creates the account and mails an invitation to set its password. */
  inviteUser(body: InviteUserBody): Observable<UserSummary> {
    return this.http.post<UserSummary>('/api/admin/users', body);
  }

  updateUser(userId: string, body: UpdateUserBody): Observable<UserSummary> {
    return this.http.patch<UserSummary>(`/api/admin/users/${encodeURIComponent(userId)}`, body);
  }

  sendResetLink(userId: string): Observable<void> {
    return this.http.post<void>(`/api/admin/users/${encodeURIComponent(userId)}/reset`, null);
  }

  /** Messages the local fake mail server kept (local mode only). */
  listMail(): Observable<KeptMail[]> {
    return this.http.get<KeptMail[]>('/api/admin/mail');
  }
}
