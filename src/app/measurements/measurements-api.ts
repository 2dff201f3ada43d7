import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { Annotation, AnnotationClass } from '../../../shared/annotations/annotations';
import type {
  Measurement,
  MeasurementDetail,
  SpecimenMeasurementSummary,
  SuggestedCrossings,
} from '../../../shared/measurements/measurement-records';
import type { MeasurementBody, SuggestBody, UpdateMeasurementBody } from '../../../shared/measurements/measurements';

/** Measurements of images and their specimen summaries; everything the measuring pages ask of the server. */
@Injectable({ providedIn: 'root' })
export class MeasurementsApi {
  private readonly http = inject(HttpClient);

  list(projectId: string, imageId: string): Observable<Measurement[]> {
    return this.http.get<Measurement[]>(this.onImage(projectId, imageId));
  }

  get(projectId: string, imageId: string, id: string): Observable<MeasurementDetail> {
    return this.http.get<MeasurementDetail>(`${this.onImage(projectId, imageId)}/${encodeURIComponent(id)}`);
  }

  create(projectId: string, imageId: string, body: MeasurementBody): Observable<Measurement> {
    return this.http.post<Measurement>(this.onImage(projectId, imageId), body);
  }

  update(projectId: string, imageId: string, id: string, body: UpdateMeasurementBody): Observable<Measurement> {
    return this.http.patch<Measurement>(`${this.onImage(projectId, imageId)}/${encodeURIComponent(id)}`, body);
  }

  recompute(projectId: string, imageId: string, id: string, version: number): Observable<Measurement> {
    return this.http.post<Measurement>(`${this.onImage(projectId, imageId)}/${encodeURIComponent(id)}/recompute`, { version });
  }

  remove(projectId: string, imageId: string, id: string, version: number): Observable<void> {
    return this.http.delete<void>(`${this.onImage(projectId, imageId)}/${encodeURIComponent(id)}`, { params: { version } });
  }

  /** Proposed crossings per test line; nothing is saved. */
  suggest(projectId: string, imageId: string, body: SuggestBody): Observable<SuggestedCrossings> {
    return this.http.post<SuggestedCrossings>(`${this.onImage(projectId, imageId)}/suggest`, body);
  }

  /** The image's drawn shapes (bond interfaces define the layer bands). */
  annotations(projectId: string, imageId: string): Observable<Annotation[]> {
    return this.http.get<Annotation[]>(`${this.project(projectId)}/images/${encodeURIComponent(imageId)}/annotations`);
  }

  annotationClasses(projectId: string): Observable<AnnotationClass[]> {
    return this.http.get<AnnotationClass[]>(`${this.project(projectId)}/annotation-classes`);
  }

  summary(projectId: string, specimenId: string): Observable<SpecimenMeasurementSummary> {
    return this.http.get<SpecimenMeasurementSummary>(`${this.onSpecimen(projectId, specimenId)}/measurements/summary`);
  }

  summaryCsvUrl(projectId: string, specimenId: string): string {
    return `${this.onSpecimen(projectId, specimenId)}/measurements/summary.csv`;
  }

  fieldsCsvUrl(projectId: string, specimenId: string): string {
    return `${this.onSpecimen(projectId, specimenId)}/measurements.csv`;
  }

  private project(projectId: string): string {
    return `/api/projects/${encodeURIComponent(projectId)}`;
  }

  private onImage(projectId: string, imageId: string): string {
    return `${this.project(projectId)}/images/${encodeURIComponent(imageId)}/measurements`;
  }

  private onSpecimen(projectId: string, specimenId: string): string {
    return `${this.project(projectId)}/specimens/${encodeURIComponent(specimenId)}`;
  }
}
