import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatAnchor, MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import {
  MatCell,
  MatCellDef,
  MatColumnDef,
  MatHeaderCell,
  MatHeaderCellDef,
  MatHeaderRow,
  MatHeaderRowDef,
  MatRow,
  MatRowDef,
  MatTable,
} from '@angular/material/table';
import { RouterLink } from '@angular/router';
import type { ProjectDetail } from '../../../shared/projects';
import { remote } from '../core/remote';
import { ArchiveApi } from './archive-api';

/** A project's samples: code, name, stack, route length and specimens. */
@Component({
  selector: 'ef-sample-list',
  imports: [
    DatePipe,
    MatAnchor,
    MatButton,
    MatCell,
    MatCellDef,
    MatColumnDef,
    MatHeaderCell,
    MatHeaderCellDef,
    MatHeaderRow,
    MatHeaderRowDef,
    MatIcon,
    MatProgressBar,
    MatRow,
    MatRowDef,
    MatTable,
    RouterLink,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="toolbar">
      <p class="intro">Plates and laminates: their layer stacks and process routes.</p>
      @if (canEdit()) {
        <a mat-flat-button [routerLink]="['/projects', project().id, 'samples', 'new']">
          <mat-icon>add</mat-icon>
          New sample
        </a>
      }
    </div>
    <section class="table-card" aria-label="Sample list">
      <div class="progress-slot">
        @if (samples.loading()) {
          <mat-progress-bar mode="indeterminate" aria-label="Loading samples" />
        }
      </div>
      @if (samples.error(); as error) {
        <div class="state" role="alert">
          <mat-icon>error_outline</mat-icon>
          <p>{{ error }}</p>
          <button mat-stroked-button type="button" (click)="samples.reload()">Try again</button>
        </div>
      } @else {
        <div class="table-scroll">
          <table mat-table [dataSource]="rows()">
            <ng-container matColumnDef="code">
              <th mat-header-cell *matHeaderCellDef>Code</th>
              <td mat-cell *matCellDef="let s">
                <a class="row-link ef-number" [routerLink]="['/projects', project().id, 'samples', s.id]">{{ s.code }}</a>
              </td>
            </ng-container>
            <ng-container matColumnDef="name">
              <th mat-header-cell *matHeaderCellDef>Name</th>
              <td mat-cell *matCellDef="let s">{{ s.name }}</td>
            </ng-container>
            <ng-container matColumnDef="stack">
              <th mat-header-cell *matHeaderCellDef>Stack, bottom to top</th>
              <td mat-cell *matCellDef="let s" class="ef-number">{{ s.stackText }}</td>
            </ng-container>
            <ng-container matColumnDef="stepCount">
              <th mat-header-cell *matHeaderCellDef>Steps</th>
              <td mat-cell *matCellDef="let s" class="ef-number">{{ s.stepCount }}</td>
            </ng-container>
            <ng-container matColumnDef="specimenCount">
              <th mat-header-cell *matHeaderCellDef>Specimens</th>
              <td mat-cell *matCellDef="let s" class="ef-number">{{ s.specimenCount }}</td>
            </ng-container>
            <ng-container matColumnDef="updatedAt">
              <th mat-header-cell *matHeaderCellDef>Updated</th>
              <td mat-cell *matCellDef="let s" class="ef-number">{{ s.updatedAt | date: 'd MMM y' }}</td>
            </ng-container>
            <tr mat-header-row *matHeaderRowDef="columns"></tr>
            <tr mat-row *matRowDef="let s; columns: columns"></tr>
          </table>
        </div>
        @if (isEmpty()) {
          <div class="state" role="status">
            <mat-icon>layers</mat-icon>
            <p>No samples yet.{{ canEdit() ? ' Record a plate or laminate with its stack and route.' : '' }}</p>
          </div>
        }
      }
    </section>
  `,
  styleUrl: './archive-lists.scss',
})
export class SampleList {
  private readonly api = inject(ArchiveApi);

  readonly project = input.required<ProjectDetail>();

  protected readonly columns = ['code', 'name', 'stack', 'stepCount', 'specimenCount', 'updatedAt'];
  private readonly projectId = computed(() => this.project().id);
  protected readonly samples = remote(this.projectId, (id) => this.api.listSamples(id));
  protected readonly rows = computed(() => (this.samples.value() ?? []).map((s) => ({ ...s, stackText: s.stack.join(' / ') })));
  protected readonly canEdit = computed(() => this.project().allowed.includes('editMetadata'));
  protected readonly isEmpty = computed(() => !this.samples.loading() && !this.samples.error() && this.rows().length === 0);
}
