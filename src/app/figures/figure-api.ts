import { HttpClient, HttpResponse } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, Observable } from 'rxjs';
import type { AnnotationClass } from '../../../shared/annotations/annotations';
import type { ExportFigureBody, Figure, FigureBody, UpdateFigureBody } from '../../../shared/figures';

/** A rendered export as the server sent it. */
export interface ExportedFile {
  blob: Blob;
  fileName: string;
}

/** Figures of one project: list, read, save with a version, delete, export; and the classes a panel may show. */
@Injectable({ providedIn: 'root' })
export class FigureApi {
  private readonly http = inject(HttpClient);

  list(projectId: string): Observable<Figure[]> {
    return this.http.get<Figure[]>(this.url(projectId));
  }

  get(projectId: string, figureId: string): Observable<Figure> {
    return this.http.get<Figure>(this.url(projectId, figureId));
  }

  create(projectId: string, body: FigureBody): Observable<Figure> {
    return this.http.post<Figure>(this.url(projectId), body);
  }

  /** 409 when `version` is no longer the stored one. */
  update(projectId: string, figureId: string, body: UpdateFigureBody): Observable<Figure> {
    return this.http.patch<Figure>(this.url(projectId, figureId), body);
  }

  remove(projectId: string, figureId: string): Observable<void> {
    return this.http.delete<void>(this.url(projectId, figureId));
  }

  /** The rendered file itself; a failure arrives with a Blob body (see `readBlobError`). */
  export(projectId: string, figureId: string, body: ExportFigureBody): Observable<ExportedFile> {
    return this.http
      .post(`${this.url(projectId, figureId)}/export`, body, { responseType: 'blob', observe: 'response' })
      .pipe(map((response) => ({ blob: response.body ?? new Blob(), fileName: fileNameOf(response, body.format) })));
  }

  annotationClasses(projectId: string): Observable<AnnotationClass[]> {
    return this.http.get<AnnotationClass[]>(`/api/projects/${encodeURIComponent(projectId)}/annotation-classes`);
  }

  private url(projectId: string, figureId?: string): string {
    const base = `/api/projects/${encodeURIComponent(projectId)}/figures`;
    return figureId ? `${base}/${encodeURIComponent(figureId)}` : base;
  }
}

function fileNameOf(response: HttpResponse<Blob>, format: 'png' | 'tiff'): string {
  const header = response.headers.get('Content-Disposition') ?? '';
  const star = /filename\*=UTF-8''([^;]+)/i.exec(header);
  if (star?.[1]) return decodeURIComponent(star[1]);
  const plain = /filename="?([^";]+)"?/i.exec(header);
  return plain?.[1] ?? `figure.${format === 'png' ? 'png' : 'tif'}`;
}

/** A failed blob request carries its JSON error body as a Blob; read it back so the message can be shown. */
export async function readBlobError(error: unknown): Promise<{ status: number; error: unknown }> {
  const e = error as { status?: number; error?: unknown };
  const status = e.status ?? 0;
  if (e.error instanceof Blob) {
    try {
      return { status, error: JSON.parse(await e.error.text()) as unknown };
    } catch {
      // Not JSON (a proxy page, an empty body): fall back to the status-only wording.
      return { status, error: null };
    }
  }
  return { status, error: e.error };
}
