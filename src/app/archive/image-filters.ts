import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output, signal, untracked } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { FormControl, NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatFormField, MatLabel, MatPrefix, MatSuffix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import { debounceTime, map, of } from 'rxjs';
import { MODALITIES, MODALITY_LABELS, PROCESSING_STATES, type Modality, type ProcessingState } from '../../../shared/images';
import type { ProjectDetail } from '../../../shared/projects';
import { remote } from '../core/remote';
import { ArchiveApi } from './archive-api';
import type { ImageQuery } from './image-api';
import { afterStepLabel } from './timeline-rows';

/** The filter part of an image query. */
export type ImageFilterValues = Omit<ImageQuery, 'page' | 'pageSize' | 'sort' | 'dir'>;

/** Typing pauses this long before the search runs again. */
const DEBOUNCE_MS = 300;

/** Every filter the image search offers: the common ones in a row, the rest behind "More filters". */
@Component({
  selector: 'ef-image-filters',
  imports: [MatButton, MatFormField, MatIcon, MatInput, MatLabel, MatOption, MatPrefix, MatSelect, MatSuffix, ReactiveFormsModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './image-filters.html',
  styleUrl: './image-filters.scss',
})
export class ImageFilters {
  private readonly api = inject(ArchiveApi);
  private readonly fb = inject(NonNullableFormBuilder);

  readonly project = input.required<ProjectDetail>();
  /** Filters a link asked for (`?specimenId=`, `?sampleId=`), applied once. */
  readonly initialSpecimenId = input<string | undefined>(undefined);
  readonly initialSampleId = input<string | undefined>(undefined);
  readonly changed = output<ImageFilterValues>();

  protected readonly modalities = MODALITIES.map((value) => ({ value, label: MODALITY_LABELS[value] }));
  protected readonly states = PROCESSING_STATES;
  protected readonly form = this.fb.group({
    q: [''],
    sampleId: [''],
    stepId: [''],
    materialId: [''],
    specimenId: [''],
    locationId: [''],
    modality: [[] as Modality[]],
    state: [[] as ProcessingState[]],
    magnificationMin: new FormControl<number | null>(null),
    magnificationMax: new FormControl<number | null>(null),
    pixelSizeMinUm: new FormControl<number | null>(null),
    pixelSizeMaxUm: new FormControl<number | null>(null),
    tags: [''],
    acquiredFrom: [''],
    acquiredTo: [''],
    uploaderId: [''],
  });
  private readonly value = toSignal(this.form.valueChanges.pipe(map(() => this.form.getRawValue())), { initialValue: this.form.getRawValue() });
  private readonly projectId = computed(() => this.project().id);
  protected readonly samples = remote(this.projectId, (id) => this.api.listSamples(id));
  protected readonly materials = remote(this.projectId, (id) => this.api.listMaterials(id));
  protected readonly specimens = remote(this.projectId, (id) => this.api.listSpecimens(id));
  private readonly chosenSample = computed(() => ({ projectId: this.projectId(), sampleId: this.value().sampleId }));
  private readonly sample = remote(this.chosenSample, ({ projectId, sampleId }) => (sampleId ? this.api.getSample(projectId, sampleId) : of(null)));
  protected readonly stepOptions = computed(() => {
    const route = this.sample.value()?.route ?? [];
    return route.map((step) => ({ id: step.id, label: afterStepLabel(route, step.id) }));
  });
  protected readonly specimenOptions = computed(() => {
    const sampleId = this.value().sampleId;
    return (this.specimens.value() ?? []).filter((s) => !sampleId || s.sampleId === sampleId).map((s) => ({ id: s.id, label: `${s.sampleCode} › ${s.code}` }));
  });
  protected readonly locationOptions = computed(() => (this.specimens.value() ?? []).find((s) => s.id === this.value().specimenId)?.locations ?? []);
  protected readonly members = computed(() => this.project().members);
  protected readonly showMore = signal(false);
  protected readonly activeCount = computed(() => countActive(this.value()));

  private readonly applyLinkFilters = effect(() => {
    const specimenId = this.initialSpecimenId();
    const sampleId = this.initialSampleId();
    untracked(() => {
      if (specimenId || sampleId) this.form.patchValue({ specimenId: specimenId ?? '', sampleId: sampleId ?? '' });
    });
  });
  private readonly emitting = this.form.valueChanges
    .pipe(
      debounceTime(DEBOUNCE_MS),
      map(() => toFilterValues(this.form.getRawValue())),
      takeUntilDestroyed(),
    )
    .subscribe((values) => this.changed.emit(values));

  protected toggleMore(): void {
    this.showMore.update((v) => !v);
  }

  protected clearFilters(): void {
    this.form.reset();
  }

  /** A narrower choice upstream clears the ones that no longer fit. */
  protected sampleChosen(): void {
    this.form.patchValue({ stepId: '', specimenId: '', locationId: '' });
  }

  protected specimenChosen(): void {
    this.form.patchValue({ locationId: '' });
  }
}

interface FormValues {
  q: string;
  sampleId: string;
  stepId: string;
  materialId: string;
  specimenId: string;
  locationId: string;
  modality: Modality[];
  state: ProcessingState[];
  magnificationMin: number | null;
  magnificationMax: number | null;
  pixelSizeMinUm: number | null;
  pixelSizeMaxUm: number | null;
  tags: string;
  acquiredFrom: string;
  acquiredTo: string;
  uploaderId: string;
}

function toFilterValues(v: FormValues): ImageFilterValues {
  return {
    ...v,
    q: v.q.trim(),
    tags: v.tags
      .split(',')
      .map((t) => t.trim())
      .filter(Boolean),
  };
}

function countActive(v: FormValues): number {
  return Object.values(v).filter((x) => (Array.isArray(x) ? x.length > 0 : x !== '' && x !== null)).length;
}
