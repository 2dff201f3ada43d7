import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
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
import { MatTooltip } from '@angular/material/tooltip';
import { formatComposition } from '../../../shared/archive/composition';
import type { Material } from '../../../shared/archive/materials';
import type { ProjectDetail } from '../../../shared/projects';
import { apiErrorMessage } from '../core/api-error-message';
import { askToConfirm } from '../core/confirm-dialog';
import { remote } from '../core/remote';
import { ArchiveApi } from './archive-api';
import type { MaterialDialogData } from './material-dialog';

/** A project's alloys with their nominal compositions; editable with the right role. */
@Component({
  selector: 'ef-material-list',
  imports: [
    MatButton,
    MatCell,
    MatCellDef,
    MatColumnDef,
    MatHeaderCell,
    MatHeaderCellDef,
    MatHeaderRow,
    MatHeaderRowDef,
    MatIcon,
    MatIconButton,
    MatProgressBar,
    MatRow,
    MatRowDef,
    MatTable,
    MatTooltip,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './material-list.html',
  styleUrl: './archive-lists.scss',
})
export class MaterialList {
  private readonly api = inject(ArchiveApi);
  private readonly dialog = inject(MatDialog);

  readonly project = input.required<ProjectDetail>();

  private readonly projectId = computed(() => this.project().id);
  protected readonly materials = remote(this.projectId, (id) => this.api.listMaterials(id));
  protected readonly rows = computed(() =>
    (this.materials.value() ?? []).map((m) => ({ ...m, compositionText: formatComposition(m.composition) })),
  );
  protected readonly canEdit = computed(() => this.project().allowed.includes('editMetadata'));
  protected readonly canDelete = computed(() => this.project().allowed.includes('delete'));
  protected readonly columns = computed(() => [
    'designation',
    'materialClass',
    'composition',
    'usedInSamples',
    ...(this.canEdit() || this.canDelete() ? ['actions'] : []),
  ]);
  protected readonly isEmpty = computed(() => !this.materials.loading() && !this.materials.error() && this.rows().length === 0);
  protected readonly busyId = signal<string | null>(null);
  protected readonly listError = signal('');

  protected async openMaterialDialog(material: Material | null): Promise<void> {
    const { MaterialDialog } = await import('./material-dialog');
    const data: MaterialDialogData = { projectId: this.projectId(), material };
    this.dialog
      .open<InstanceType<typeof MaterialDialog>, MaterialDialogData, Material>(MaterialDialog, { data, width: '640px', maxHeight: '90vh' })
      .afterClosed()
      .subscribe((saved) => {
        if (saved) this.materials.reload();
      });
  }

  protected deleteMaterial(material: Material): void {
    askToConfirm(this.dialog, {
      title: `Delete ${material.designation}?`,
      message: 'The material and its composition are removed from this project. A material still used in a sample’s stack cannot be deleted.',
      confirmLabel: 'Delete',
    }).subscribe((confirmed) => {
      if (confirmed) this.sendDeletion(material);
    });
  }

  private sendDeletion(material: Material): void {
    this.busyId.set(material.id);
    this.listError.set('');
    this.api.deleteMaterial(this.projectId(), material.id).subscribe({
      next: () => {
        this.busyId.set(null);
        this.materials.reload();
      },
      error: (error) => {
        this.listError.set(apiErrorMessage(error).message);
        this.busyId.set(null);
      },
    });
  }
}
