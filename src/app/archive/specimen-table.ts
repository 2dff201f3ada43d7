import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIcon } from '@angular/material/icon';
import {
  MatCell,
  MatCellDef,
  MatColumnDef,
  MatHeaderCell,
  MatHeaderCellDef,
  MatHeaderRow,
  MatHeaderRowDef,
  MatNoDataRow,
  MatRow,
  MatRowDef,
  MatTable,
} from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { SECTION_PLANE_LABELS, type Specimen } from '../../../shared/archive/specimens';
import { formatEtchingTime } from './quantities';

/** The specimens cut from one sample. */
@Component({
  selector: 'ef-specimen-table',
  imports: [MatCell, MatCellDef, MatColumnDef, MatHeaderCell, MatHeaderCellDef, MatHeaderRow, MatHeaderRowDef, MatIcon, MatNoDataRow, MatRow, MatRowDef, MatTable, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="table-card table-scroll">
      <table mat-table [dataSource]="rows()" aria-label="Specimens of this sample">
        <ng-container matColumnDef="code">
          <th mat-header-cell *matHeaderCellDef>Code</th>
          <td mat-cell *matCellDef="let s">
            <a class="row-link ef-number" [routerLink]="['/projects', projectId(), 'specimens', s.id]">{{ s.code }}</a>
          </td>
        </ng-container>
        <ng-container matColumnDef="afterStep">
          <th mat-header-cell *matHeaderCellDef>Cut</th>
          <td mat-cell *matCellDef="let s">{{ s.afterStepLabel }}</td>
        </ng-container>
        <ng-container matColumnDef="sectionPlane">
          <th mat-header-cell *matHeaderCellDef>Section plane</th>
          <td mat-cell *matCellDef="let s">{{ s.planeLabel }}</td>
        </ng-container>
        <ng-container matColumnDef="etchant">
          <th mat-header-cell *matHeaderCellDef>Etchant</th>
          <td mat-cell *matCellDef="let s" class="caution-cell">
            @if (s.preparation.etchant) {
              <mat-icon aria-hidden="true">warning</mat-icon>
              {{ s.etchantText }}
            } @else {
              <span class="none">not etched</span>
            }
          </td>
        </ng-container>
        <ng-container matColumnDef="locations">
          <th mat-header-cell *matHeaderCellDef>Locations</th>
          <td mat-cell *matCellDef="let s" class="ef-number">{{ s.locations.length }}</td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let s; columns: columns"></tr>
        <tr class="mat-mdc-row" *matNoDataRow>
          <td class="mat-mdc-cell empty" [attr.colspan]="columns.length">No specimens cut from this sample yet.</td>
        </tr>
      </table>
    </div>
  `,
  styleUrl: './archive-lists.scss',
  styles: `
    .none,
    .empty {
      color: var(--mat-sys-on-surface-variant);
    }
    .empty {
      padding: 16px;
    }
  `,
})
export class SpecimenTable {
  readonly specimens = input.required<readonly Specimen[]>();
  readonly projectId = input.required<string>();

  protected readonly columns = ['code', 'afterStep', 'sectionPlane', 'etchant', 'locations'];
  protected readonly rows = computed(() =>
    this.specimens().map((s) => ({
      ...s,
      planeLabel: SECTION_PLANE_LABELS[s.sectionPlane],
      etchantText: [s.preparation.etchant, formatEtchingTime(s.preparation.etchingTimeS)].filter(Boolean).join(', '),
    })),
  );
}
