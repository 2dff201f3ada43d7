import { inject } from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import type { CanDeactivateFn } from '@angular/router';
import { of } from 'rxjs';
import { askToConfirm } from '../core/confirm-dialog';

/** A page that can hold edits not yet saved. */
export interface HoldsEdits {
  hasUnsavedChanges(): boolean;
}

/** Asks before leaving a figure with unsaved changes. */
export const leaveGuard: CanDeactivateFn<HoldsEdits> = (page) => {
  if (!page.hasUnsavedChanges()) return of(true);
  return askToConfirm(inject(MatDialog), {
    title: 'Leave without saving?',
    message: 'This figure has changes that are not saved. They will be lost.',
    confirmLabel: 'Leave',
  });
};
