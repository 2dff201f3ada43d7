import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButton } from '@angular/material/button';
import {
  MAT_DIALOG_DATA,
  MatDialog,
  MatDialogActions,
  MatDialogClose,
  MatDialogContent,
  MatDialogTitle,
} from '@angular/material/dialog';
import { map, Observable } from 'rxjs';

export interface Confirmation {
  title: string;
  message: string;
  /** The verb on the confirming button, e.g. "Deactivate". */
  confirmLabel: string;
}

/** Asks before a change that is hard to undo; closes with true to go ahead. */
@Component({
  selector: 'ef-confirm-dialog',
  imports: [MatButton, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogTitle],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>{{ data.title }}</h2>
    <mat-dialog-content>
      <p>{{ data.message }}</p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="false">Cancel</button>
      <button mat-flat-button type="button" [mat-dialog-close]="true">
        {{ data.confirmLabel }}
      </button>
    </mat-dialog-actions>
  `,
})
export class ConfirmDialog {
  protected readonly data = inject<Confirmation>(MAT_DIALOG_DATA);
}

/** Opens the dialog; emits once, true only when the user confirmed. */
export function askToConfirm(dialog: MatDialog, confirmation: Confirmation): Observable<boolean> {
  return dialog
    .open<ConfirmDialog, Confirmation, boolean>(ConfirmDialog, { data: confirmation, width: '420px' })
    .afterClosed()
    .pipe(map((answer) => answer === true));
}
