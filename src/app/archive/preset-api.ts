import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';
import type { CalibrationPreset, CalibrationPresetBody } from '../../../shared/calibration';

/** Saved instrument set-ups with a known pixel size, applied to one or many images. */
@Injectable({ providedIn: 'root' })
export class PresetApi {
  private readonly http = inject(HttpClient);

  list(projectId: string): Observable<CalibrationPreset[]> {
    return this.http.get<CalibrationPreset[]>(`/api/projects/${projectId}/calibration-presets`);
  }

  create(projectId: string, body: CalibrationPresetBody): Observable<CalibrationPreset> {
    return this.http.post<CalibrationPreset>(`/api/projects/${projectId}/calibration-presets`, body);
  }

  apply(projectId: string, presetId: string, imageIds: string[]): Observable<{ updated: number }> {
    return this.http.post<{ updated: number }>(`/api/projects/${projectId}/calibration-presets/${presetId}/apply`, { imageIds });
  }
}
