import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { HealthReport } from '../../../shared/health';

/** The server's own report: version, mode and whether its database answers. */
@Injectable({ providedIn: 'root' })
export class HealthApi {
  private readonly http = inject(HttpClient);

  get(): Observable<HealthReport> {
    return this.http.get<HealthReport>('/api/health');
  }
}
