import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogTitle } from '@angular/material/dialog';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import type { AnnotationClass, AnnotationClassBody } from '../../../shared/annotations/annotations';
import { ANNOTATION_COLOURS, SHAPE_KINDS, type AnnotationColour, type ShapeKind } from '../../../shared/annotations/kinds';
import { apiErrorMessage } from '../core/api-error-message';
import { ViewerApi } from './viewer-api';

interface Row extends AnnotationClassBody {
  id: string | null;
  usage: number;
  error: string;
  /** Set after a refused delete of a class in use: where its shapes should go. */
  moveTo: string | null;
}

const SHAPE_KIND_NAMES: Record<ShapeKind, string> = {
  line: 'Lines',
  point: 'Points',
  outline: 'Outlines',
  point_or_outline: 'Points or outlines',
  text: 'Notes',
};

/** The project's annotation classes, for its lead: names, colours from our palette, what they are drawn as. */
@Component({
  selector: 'ef-class-editor-dialog',
  imports: [MatButton, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogTitle, MatFormField, MatIcon, MatIconButton, MatInput, MatLabel, MatOption, MatSelect],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Annotation classes</h2>
    <mat-dialog-content>
      <p class="hint">Classes belong to the project: every image uses the same set. Rulers and angles fit every class.</p>
      @for (row of rows(); track $index) {
        <div class="row">
          <mat-form-field class="name">
            <mat-label>Name</mat-label>
            <input matInput [value]="row.name" (input)="edit($index, { name: $any($event.target).value })" [attr.aria-label]="'Name of class ' + ($index + 1)" />
          </mat-form-field>
          <mat-form-field class="colour">
            <mat-label>Colour</mat-label>
            <mat-select [value]="row.colour" (valueChange)="edit($index, { colour: $event })" [attr.aria-label]="'Colour of ' + (row.name || 'the new class')">
              @for (c of colours; track c) {
                <mat-option [value]="c"><span class="swatch" [style.background]="palette[c]"></span> {{ c }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
          <mat-form-field class="kind">
            <mat-label>Drawn as</mat-label>
            <mat-select [value]="row.shapeKind" (valueChange)="edit($index, { shapeKind: $event })" [attr.aria-label]="'Shapes of ' + (row.name || 'the new class')">
              @for (k of kinds; track k) {
                <mat-option [value]="k">{{ kindNames[k] }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
          <button mat-icon-button type="button" [attr.aria-label]="'Save ' + (row.name || 'the new class')" (click)="save($index)">
            <mat-icon>check</mat-icon>
          </button>
          @if (row.id) {
            <button mat-icon-button type="button" [attr.aria-label]="'Delete ' + row.name" (click)="remove($index)">
              <mat-icon>delete</mat-icon>
            </button>
          }
        </div>
        @if (row.moveTo !== null) {
          <div class="move">
            <mat-form-field class="name">
              <mat-label>Move its shapes to</mat-label>
              <mat-select [value]="row.moveTo" (valueChange)="setMoveTo($index, $event)" aria-label="Class to move the shapes to">
                @for (other of others(row.id); track other.id) {
                  <mat-option [value]="other.id">{{ other.name }}</mat-option>
                }
              </mat-select>
            </mat-form-field>
            <button mat-stroked-button type="button" [disabled]="!row.moveTo" (click)="remove($index)">Move and delete</button>
          </div>
        }
        @if (row.error) {
          <p class="error" role="alert">{{ row.error }}</p>
        }
      }
      <button mat-button type="button" (click)="addRow()"><mat-icon>add</mat-icon> Add a class</button>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-flat-button type="button" mat-dialog-close>Done</button>
    </mat-dialog-actions>
  `,
  styles: `
    .hint {
      margin: 0 0 8px;
      color: var(--mat-sys-on-surface-variant);
    }
    .row,
    .move {
      display: flex;
      align-items: center;
      gap: 8px;
    }
    .name {
      flex: 1 1 180px;
    }
    .colour,
    .kind {
      width: 150px;
    }
    .swatch {
      display: inline-block;
      width: 12px;
      height: 12px;
      border-radius: 3px;
      vertical-align: -1px;
    }
    .error {
      margin: 0 0 8px;
      color: var(--mat-sys-error);
    }
  `,
})
export class ClassEditorDialog {
  private readonly api = inject(ViewerApi);
  private readonly data = inject<{ projectId: string; classes: AnnotationClass[] }>(MAT_DIALOG_DATA);

  protected readonly palette = ANNOTATION_COLOURS;
  protected readonly colours = Object.keys(ANNOTATION_COLOURS) as AnnotationColour[];
  protected readonly kinds = SHAPE_KINDS;
  protected readonly kindNames = SHAPE_KIND_NAMES;
  protected readonly rows = signal<Row[]>(
    this.data.classes.map((c) => ({ id: c.id, name: c.name, colour: c.colour, shapeKind: c.shapeKind, usage: c.usage, error: '', moveTo: null })),
  );

  protected others(id: string | null): Row[] {
    return this.rows().filter((r) => r.id && r.id !== id);
  }

  protected edit(i: number, change: Partial<Row>): void {
    this.rows.update((rows) => rows.map((r, j) => (j === i ? { ...r, error: '', ...change } : r)));
  }

  protected setMoveTo(i: number, classId: string): void {
    this.edit(i, { moveTo: classId });
  }

  protected addRow(): void {
    this.rows.update((rows) => [...rows, { id: null, name: '', colour: 'cobalt', shapeKind: 'outline', usage: 0, error: '', moveTo: null }]);
  }

  protected save(i: number): void {
    const row = this.rows()[i]!;
    const body: AnnotationClassBody = { name: row.name, colour: row.colour, shapeKind: row.shapeKind };
    const request = row.id ? this.api.updateClass(this.data.projectId, row.id, body) : this.api.createClass(this.data.projectId, body);
    request.subscribe({
      next: (saved) => this.edit(i, { id: saved.id, name: saved.name, usage: saved.usage }),
      error: (err: HttpErrorResponse) => this.fail(i, err),
    });
  }

  protected remove(i: number): void {
    const row = this.rows()[i]!;
    if (!row.id) return;
    this.api.deleteClass(this.data.projectId, row.id, row.moveTo ?? undefined).subscribe({
      next: () => this.rows.update((rows) => rows.filter((_, j) => j !== i)),
      error: (err: HttpErrorResponse) => {
        // In use: the server keeps the class until its shapes have somewhere to go.
        if (err.status === 409) this.edit(i, { moveTo: row.moveTo ?? '', error: apiErrorMessage(err).message });
        else this.fail(i, err);
      },
    });
  }

  private fail(i: number, err: HttpErrorResponse): void {
    const m = apiErrorMessage(err);
    this.rows.update((rows) => rows.map((r, j) => (j === i ? { ...r, error: Object.values(m.fieldErrors)[0] ?? m.message } : r)));
  }
}
