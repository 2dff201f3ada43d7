import { HttpClient, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { CreateMaterialBody, Material, UpdateMaterialBody } from '../../../shared/archive/materials';
import type { SampleDetail, SampleSummary } from '../../../shared/archive/samples';
import type { Location, LocationBody, Specimen } from '../../../shared/archive/specimens';
import type { StackLayer } from '../../../shared/archive/process-route';
import type { StepBody } from './sample-form-model';

/** A sample as the form sends it (the shared type is zod's parsed output, with defaults filled in). */
export interface SampleBody {
  code: string;
  name: string;
  description: string;
  layers: StackLayer[];
  route: StepBody[];
}

/** A specimen as the form sends it. */
export interface SpecimenBody {
  code: string;
  afterStepId: string | null;
  sectionPlane: Specimen['sectionPlane'];
  preparation: Specimen['preparation'];
  notes: string;
}

/** Materials, samples, specimens and locations of one project. */
@Injectable({ providedIn: 'root' })
export class ArchiveApi {
  private readonly http = inject(HttpClient);

  listMaterials(projectId: string): Observable<Material[]> {
    return this.http.get<Material[]>(this.url(projectId, 'materials'));
  }

  createMaterial(projectId: string, body: CreateMaterialBody): Observable<Material> {
    return this.http.post<Material>(this.url(projectId, 'materials'), body);
  }

  updateMaterial(projectId: string, materialId: string, body: UpdateMaterialBody): Observable<Material> {
    return this.http.patch<Material>(this.url(projectId, 'materials', materialId), body);
  }

  deleteMaterial(projectId: string, materialId: string): Observable<void> {
    return this.http.delete<void>(this.url(projectId, 'materials', materialId));
  }

  listSamples(projectId: string): Observable<SampleSummary[]> {
    return this.http.get<SampleSummary[]>(this.url(projectId, 'samples'));
  }

  getSample(projectId: string, sampleId: string): Observable<SampleDetail> {
    return this.http.get<SampleDetail>(this.url(projectId, 'samples', sampleId));
  }

  createSample(projectId: string, body: SampleBody): Observable<SampleDetail> {
    return this.http.post<SampleDetail>(this.url(projectId, 'samples'), body);
  }

  /** Layers and route are replaced as wholes; steps sent with their id are kept. */
  updateSample(projectId: string, sampleId: string, body: Partial<SampleBody>): Observable<SampleDetail> {
    return this.http.patch<SampleDetail>(this.url(projectId, 'samples', sampleId), body);
  }

  deleteSample(projectId: string, sampleId: string): Observable<void> {
    return this.http.delete<void>(this.url(projectId, 'samples', sampleId));
  }

  /** A sample's specimens, or every specimen of the project without `sampleId`. */
  listSpecimens(projectId: string, sampleId?: string): Observable<Specimen[]> {
    const params = new HttpParams({ fromObject: sampleId ? { sampleId } : {} });
    return this.http.get<Specimen[]>(this.url(projectId, 'specimens'), { params });
  }

  getSpecimen(projectId: string, specimenId: string): Observable<Specimen> {
    return this.http.get<Specimen>(this.url(projectId, 'specimens', specimenId));
  }

  createSpecimen(projectId: string, body: SpecimenBody & { sampleId: string }): Observable<Specimen> {
    return this.http.post<Specimen>(this.url(projectId, 'specimens'), body);
  }

  updateSpecimen(projectId: string, specimenId: string, body: Partial<SpecimenBody>): Observable<Specimen> {
    return this.http.patch<Specimen>(this.url(projectId, 'specimens', specimenId), body);
  }

  deleteSpecimen(projectId: string, specimenId: string): Observable<void> {
    return this.http.delete<void>(this.url(projectId, 'specimens', specimenId));
  }

  addLocation(projectId: string, specimenId: string, body: LocationBody): Observable<Location> {
    return this.http.post<Location>(this.url(projectId, 'specimens', specimenId, 'locations'), body);
  }

  updateLocation(projectId: string, specimenId: string, locationId: string, body: LocationBody): Observable<Location> {
    return this.http.put<Location>(this.url(projectId, 'specimens', specimenId, 'locations', locationId), body);
  }

  deleteLocation(projectId: string, specimenId: string, locationId: string): Observable<void> {
    return this.http.delete<void>(this.url(projectId, 'specimens', specimenId, 'locations', locationId));
  }

  private url(projectId: string, ...parts: string[]): string {
    return ['/api/projects', projectId, ...parts].map((p, i) => (i === 0 ? p : encodeURIComponent(p))).join('/');
  }
}
