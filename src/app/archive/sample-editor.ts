import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormArray, FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatAnchor, MatButton } from '@angular/material/button';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Title } from '@angular/platform-browser';
import { Router, RouterLink } from '@angular/router';
import { map, of } from 'rxjs';
import type { SampleDetail } from '../../../shared/archive/samples';
import { apiErrorMessage } from '../core/api-error-message';
import { remote } from '../core/remote';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { ProjectApi } from '../projects/project-api';
import { ArchiveApi, type SampleBody } from './archive-api';
import { Breadcrumbs, type Crumb } from './breadcrumbs';
import { CODE_MESSAGE, CODE_PATTERN, textMatching } from './field-validators';
import { fieldProblems, formErrorText, placeFieldErrors } from './form-errors';
import { LayerStackPicture } from './layer-stack-picture';
import { LayersEditor } from './layers-editor';
import { RouteEditor } from './route-editor';
import { layerGroup, stepGroup, type LayerGroup, type StepGroup } from './sample-form';
import { layerBody, previewStates, stepBody, stepFormValue, stepParams } from './sample-form-model';
import { timelineRows } from './timeline-rows';

/** Creates a sample or edits one: details, the initial stack and the process route, with a live preview of what the route implies. */
@Component({
  selector: 'ef-sample-editor',
  imports: [
    Breadcrumbs,
    LayerStackPicture,
    LayersEditor,
    MatAnchor,
    MatButton,
    MatError,
    MatFormField,
    MatHint,
    MatIcon,
    MatInput,
    MatLabel,
    MatProgressBar,
    ReactiveFormsModule,
    RouteEditor,
    RouterLink,
    ValidationMessagePipe,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './sample-editor.html',
  styleUrl: './sample-editor.scss',
})
export default class SampleEditor {
  private readonly api = inject(ArchiveApi);
  private readonly projectApi = inject(ProjectApi);
  private readonly router = inject(Router);
  private readonly title = inject(Title);

  /** Route parameters; no sampleId for a new sample. */
  readonly projectId = input.required<string>();
  readonly sampleId = input<string>();

  private readonly ids = computed(() => ({ projectId: this.projectId(), sampleId: this.sampleId() ?? null }));
  protected readonly project = remote(this.projectId, (id) => this.projectApi.get(id));
  protected readonly materials = remote(this.projectId, (id) => this.api.listMaterials(id));
  protected readonly sample = remote(this.ids, ({ projectId, sampleId }) => (sampleId ? this.api.getSample(projectId, sampleId) : of(null)));
  private readonly specimens = remote(this.ids, ({ projectId, sampleId }) => (sampleId ? this.api.listSpecimens(projectId, sampleId) : of([])));

  protected readonly form = new FormGroup({
    code: new FormControl('', { nonNullable: true, validators: [Validators.required, textMatching(CODE_PATTERN, CODE_MESSAGE)] }),
    name: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.maxLength(120)] }),
    description: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(4000)] }),
    layers: new FormArray<LayerGroup>([layerGroup({ materialId: '', thicknessMm: null }), layerGroup({ materialId: '', thicknessMm: null })]),
    route: new FormArray<StepGroup>([]),
  });
  private readonly value = toSignal(this.form.valueChanges.pipe(map(() => this.form.getRawValue())), { initialValue: this.form.getRawValue() });

  protected readonly isNew = computed(() => !this.sampleId());
  protected readonly materialList = computed(() => this.materials.value() ?? []);
  protected readonly noMaterials = computed(() => this.materials.value()?.length === 0);
  private readonly designationOf = computed(() => new Map(this.materialList().map((m) => [m.id, m.designation])));
  /** Layers complete enough to draw and compute with. */
  private readonly completeLayers = computed(() =>
    this.value()
      .layers.filter((l) => l.materialId && l.thicknessMm !== null && l.thicknessMm > 0)
      .map((l) => ({ materialId: l.materialId, thicknessMm: l.thicknessMm!, designation: this.designationOf().get(l.materialId) ?? '?' })),
  );
  protected readonly previewLayers = this.completeLayers;
  protected readonly previewRows = computed(() => {
    const v = this.value();
    const states = previewStates(this.completeLayers(), v.route);
    const steps = v.route.map((s) => ({ type: s.type, params: stepParams(s), date: s.date || null, notes: s.notes }));
    return timelineRows(this.completeLayers().map((l) => l.designation), steps, states);
  });
  protected readonly specimensByStep = computed(() => {
    const byStep = new Map<string, string[]>();
    for (const s of this.specimens.value() ?? []) if (s.afterStepId) byStep.set(s.afterStepId, [...(byStep.get(s.afterStepId) ?? []), s.code]);
    return byStep;
  });
  protected readonly crumbs = computed<Crumb[]>(() => {
    const project = { label: this.project.value()?.code ?? 'Project', link: ['/projects', this.projectId()] };
    const s = this.sample.value();
    return this.isNew()
      ? [{ label: 'Projects', link: ['/projects'] }, project, { label: 'New sample' }]
      : [{ label: 'Projects', link: ['/projects'] }, project, { label: s?.code ?? 'Sample', link: ['/projects', this.projectId(), 'samples', this.sampleId()!] }, { label: 'Edit' }];
  });
  protected readonly cancelLink = computed(() =>
    this.isNew() ? ['/projects', this.projectId()] : ['/projects', this.projectId(), 'samples', this.sampleId()!],
  );
  protected readonly submitting = signal(false);
  protected readonly formError = signal('');
  /** The sample id the form was filled from, so a reload does not overwrite edits. */
  private readonly filledFrom = signal<string | null>(null);

  private readonly fillWhenLoaded = effect(() => {
    const s = this.sample.value();
    if (s && untracked(this.filledFrom) !== s.id) untracked(() => this.fill(s));
  });
  private readonly pageTitle = effect(() => {
    const s = this.sample.value();
    this.title.setTitle(s ? `Edit ${s.code} · Etchfile` : 'New sample · Etchfile');
  });

  protected save(): void {
    this.form.markAllAsTouched();
    if (this.submitting()) return;
    if (this.form.invalid) {
      this.formError.set('Check the fields marked in red.');
      return;
    }
    const v = this.form.getRawValue();
    const body: SampleBody = {
      code: v.code.trim(),
      name: v.name.trim(),
      description: v.description.trim(),
      layers: v.layers.map(layerBody),
      route: v.route.map(stepBody),
    };
    const sampleId = this.sampleId();
    const request = sampleId ? this.api.updateSample(this.projectId(), sampleId, body) : this.api.createSample(this.projectId(), body);
    this.submitting.set(true);
    this.formError.set('');
    request.subscribe({
      next: (saved) => void this.router.navigate(['/projects', this.projectId(), 'samples', saved.id]),
      error: (error) => {
        const problems = fieldProblems(error.error);
        const leftOver = placeFieldErrors(this.form, problems);
        this.formError.set(formErrorText(apiErrorMessage(error).message, problems, leftOver));
        this.submitting.set(false);
      },
    });
  }

  private fill(sample: SampleDetail): void {
    const { layers, route } = this.form.controls;
    layers.clear();
    for (const l of sample.layers) layers.push(layerGroup({ materialId: l.materialId, thicknessMm: l.thicknessMm }));
    route.clear();
    for (const step of sample.route) route.push(stepGroup(stepFormValue(step)));
    this.form.patchValue({ code: sample.code, name: sample.name, description: sample.description });
    this.filledFrom.set(sample.id);
  }
}
