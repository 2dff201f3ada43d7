import { HttpClient, HttpHeaders } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { from, Observable, of, switchMap } from 'rxjs';
import type { AlignmentBody, ImageAlignment } from '../../../shared/alignments';
import type { Annotation, AnnotationBody, AnnotationClass, AnnotationClassBody, UpdateAnnotationBody } from '../../../shared/annotations/annotations';
import type { CalibrationChange, DrawnCalibrationBody } from '../../../shared/calibration';
import type { ImageRecord, ImageSummary } from '../../../shared/images';
import type { Page } from '../../../shared/paging';
import type { ProjectDetail } from '../../../shared/projects';
import { takeEarly } from './head-start';

/** Everything the viewer asks of the server: the image and its files, its annotations, classes and calibration. */
@Injectable({ providedIn: 'root' })
export class ViewerApi {
  private readonly http = inject(HttpClient);

  project(projectId: string): Observable<ProjectDetail> {
    return this.http.get<ProjectDetail>(`/api/projects/${enc(projectId)}`);
  }

  /** The record, from the request main.ts started early when there is one (see head-start.ts). */
  image(projectId: string, imageId: string): Observable<ImageRecord> {
    const url = imageUrl(projectId, imageId);
    const asked = this.http.get<ImageRecord>(url);
    const early = takeEarly<ImageRecord>(url);
    return early ? from(early).pipe(switchMap((record) => (record ? of(record) : asked))) : asked;
  }

  /** Other images filed at the same location (for side-by-side viewing). */
  imagesAtLocation(projectId: string, locationId: string): Observable<Page<ImageSummary>> {
    return this.http.get<Page<ImageSummary>>(`/api/projects/${enc(projectId)}/images`, { params: { locationId, state: 'ready', pageSize: 50 } });
  }

  classes(projectId: string): Observable<AnnotationClass[]> {
    return this.http.get<AnnotationClass[]>(`${projectUrl(projectId)}/annotation-classes`);
  }

  createClass(projectId: string, body: AnnotationClassBody): Observable<AnnotationClass> {
    return this.http.post<AnnotationClass>(`${projectUrl(projectId)}/annotation-classes`, body);
  }

  updateClass(projectId: string, classId: string, body: AnnotationClassBody): Observable<AnnotationClass> {
    return this.http.put<AnnotationClass>(`${projectUrl(projectId)}/annotation-classes/${enc(classId)}`, body);
  }

  /** 409 while the class is in use, unless its shapes move to `moveTo`. */
  deleteClass(projectId: string, classId: string, moveTo?: string): Observable<void> {
    const params: Record<string, string> = moveTo ? { moveTo } : {};
    return this.http.delete<void>(`${projectUrl(projectId)}/annotation-classes/${enc(classId)}`, { params });
  }

  annotations(projectId: string, imageId: string): Observable<Annotation[]> {
    return this.http.get<Annotation[]>(`${imageUrl(projectId, imageId)}/annotations`);
  }

  createAnnotation(projectId: string, imageId: string, body: AnnotationBody): Observable<Annotation> {
    return this.http.post<Annotation>(`${imageUrl(projectId, imageId)}/annotations`, body);
  }

  /** 409 when someone changed the shape after `body.version`. */
  updateAnnotation(projectId: string, imageId: string, id: string, body: UpdateAnnotationBody): Observable<Annotation> {
    return this.http.patch<Annotation>(`${imageUrl(projectId, imageId)}/annotations/${enc(id)}`, body);
  }

  deleteAnnotation(projectId: string, imageId: string, id: string, version: number): Observable<void> {
    return this.http.delete<void>(`${imageUrl(projectId, imageId)}/annotations/${enc(id)}`, { params: { version } });
  }

  exportGeoJson(projectId: string, imageId: string): Observable<Blob> {
    return this.http.get(`${imageUrl(projectId, imageId)}/annotations.geojson`, { responseType: 'blob' });
  }

  /** All or nothing: 422 lists the problems of every refused feature. */
  importGeoJson(projectId: string, imageId: string, fileText: string): Observable<{ imported: number }> {
    const headers = new HttpHeaders({ 'Content-Type': 'application/geo+json' });
    return this.http.post<{ imported: number }>(`${imageUrl(projectId, imageId)}/annotations.geojson`, fileText, { headers });
  }

  /** The new pixel size comes back in the updated record; 422 carries the plausibility warning. */
  calibrateByLine(projectId: string, imageId: string, body: DrawnCalibrationBody): Observable<ImageRecord> {
    return this.http.post<ImageRecord>(`${imageUrl(projectId, imageId)}/calibration/drawn`, body);
  }

  calibrationHistory(projectId: string, imageId: string): Observable<CalibrationChange[]> {
    return this.http.get<CalibrationChange[]>(`${imageUrl(projectId, imageId)}/calibration/history`);
  }

  /** Every saved alignment of this image with another of its location, seen from this image. */
  alignments(projectId: string, imageId: string): Observable<ImageAlignment[]> {
    return this.http.get<ImageAlignment[]>(`${imageUrl(projectId, imageId)}/alignments`);
  }

  /** The server fits the transform from the pairs; 422 says why pairs were refused. */
  saveAlignment(projectId: string, imageId: string, otherImageId: string, body: AlignmentBody): Observable<ImageAlignment> {
    return this.http.put<ImageAlignment>(`${imageUrl(projectId, imageId)}/alignments/${enc(otherImageId)}`, body);
  }

  removeAlignment(projectId: string, imageId: string, otherImageId: string): Observable<void> {
    return this.http.delete<void>(`${imageUrl(projectId, imageId)}/alignments/${enc(otherImageId)}`);
  }
}

const enc = encodeURIComponent;

function projectUrl(projectId: string): string {
  return `/api/projects/${enc(projectId)}`;
}

export function imageUrl(projectId: string, imageId: string): string {
  return `${projectUrl(projectId)}/images/${enc(imageId)}`;
}

/** A Deep Zoom tile: `tiles/{level}/{col}_{row}.jpg`. */
export function tileUrl(projectId: string, imageId: string, level: number, col: number, row: number): string {
  return `${imageUrl(projectId, imageId)}/tiles/${level}/${col}_${row}.jpg`;
}

export function previewUrl(projectId: string, imageId: string): string {
  return `${imageUrl(projectId, imageId)}/preview`;
}
