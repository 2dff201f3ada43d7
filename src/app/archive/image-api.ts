import { HttpClient, HttpEvent, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { ImageRecord, ImageSortField, ImageSummary, Modality, ProcessingState, UploadResult } from '../../../shared/images';
import type { Page } from '../../../shared/paging';

/** The search as the client asks it; every filter optional, lists sent comma-separated. */
export interface ImageQuery {
  page: number;
  pageSize: number;
  sort: ImageSortField;
  dir: 'asc' | 'desc';
  q?: string;
  sampleId?: string;
  materialId?: string;
  stepId?: string;
  specimenId?: string;
  locationId?: string;
  modality?: readonly Modality[];
  state?: readonly ProcessingState[];
  magnificationMin?: number | null;
  magnificationMax?: number | null;
  pixelSizeMinUm?: number | null;
  pixelSizeMaxUm?: number | null;
  tags?: readonly string[];
  acquiredFrom?: string;
  acquiredTo?: string;
  uploaderId?: string;
}

/** A change to an image's description or pixel size (the file itself never changes). */
export interface ImageChange {
  pixelSizeUm?: number;
  pixelSizeYUm?: number;
  confirmPixelSize?: true;
  notes?: string;
  tags?: string[];
}

/** Images of one project: search, upload with progress, read, describe, retry, and the addresses of their views. */
@Injectable({ providedIn: 'root' })
export class ImageApi {
  private readonly http = inject(HttpClient);

  search(projectId: string, query: ImageQuery): Observable<Page<ImageSummary>> {
    return this.http.get<Page<ImageSummary>>(this.url(projectId), { params: searchParams(query) });
  }

  get(projectId: string, imageId: string): Observable<ImageRecord> {
    return this.http.get<ImageRecord>(this.url(projectId, imageId));
  }

  /** One file per request; emits progress events, then the response with the stored record. */
  upload(projectId: string, file: File, fields: Record<string, string>): Observable<HttpEvent<UploadResult>> {
    const form = new FormData();
    // Text fields first, so they are read before the (large) file part.
    for (const [name, value] of Object.entries(fields)) form.append(name, value);
    form.append('file', file, file.name);
    return this.http.post<UploadResult>(this.url(projectId), form, { reportProgress: true, observe: 'events' });
  }

  update(projectId: string, imageId: string, change: ImageChange): Observable<ImageRecord> {
    return this.http.patch<ImageRecord>(this.url(projectId, imageId), change);
  }

  retry(projectId: string, imageId: string): Observable<ImageRecord> {
    return this.http.post<ImageRecord>(`${this.url(projectId, imageId)}/retry`, null);
  }

  remove(projectId: string, imageId: string): Observable<void> {
    return this.http.delete<void>(this.url(projectId, imageId));
  }

  thumbnailUrl(projectId: string, imageId: string): string {
    return `${this.url(projectId, imageId)}/thumbnail`;
  }

  previewUrl(projectId: string, imageId: string): string {
    return `${this.url(projectId, imageId)}/preview`;
  }

  originalUrl(projectId: string, imageId: string): string {
    return `${this.url(projectId, imageId)}/original`;
  }

  private url(projectId: string, imageId?: string): string {
    const base = `/api/projects/${encodeURIComponent(projectId)}/images`;
    return imageId ? `${base}/${encodeURIComponent(imageId)}` : base;
  }
}

/** Only the filters that are set; lists comma-separated, as the server reads them. */
export function searchParams(query: ImageQuery): HttpParams {
  let params = new HttpParams();
  for (const [key, value] of Object.entries(query)) {
    if (value === undefined || value === null || value === '') continue;
    if (Array.isArray(value)) {
      if (value.length > 0) params = params.set(key, value.join(','));
    } else {
      params = params.set(key, String(value));
    }
  }
  return params;
}
