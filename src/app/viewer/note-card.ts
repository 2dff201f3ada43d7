import { afterNextRender, ChangeDetectionStrategy, Component, ElementRef, output, signal, viewChild } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';

/** Beside a note pin just placed: its text, Add note or Cancel. Takes the keyboard as it opens. */
@Component({
  selector: 'ef-note-card',
  imports: [MatButton, MatFormField, MatInput, MatLabel],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <form class="card" (submit)="$event.preventDefault(); add()">
      <mat-form-field subscriptSizing="dynamic">
        <mat-label>Note</mat-label>
        <input #field matInput name="note" aria-label="Note text" [value]="text()" (input)="text.set($any($event.target).value)" />
      </mat-form-field>
      <button mat-button type="button" (click)="cancelled.emit()">Cancel</button>
      <button mat-flat-button type="submit" [disabled]="!text().trim()">Add note</button>
    </form>
  `,
  styles: `
    .card {
      display: flex;
      align-items: center;
      gap: 8px;
      padding: 8px 12px;
      border-radius: var(--mat-sys-corner-medium);
      background: var(--mat-sys-surface-container-high);
      box-shadow: var(--mat-sys-level3);
    }
  `,
})
export class NoteCard {
  /** Enter in the viewer (outside this field) adds the note too: the page asks for the text. */
  readonly added = output<string>();
  readonly cancelled = output<void>();

  private readonly field = viewChild.required<ElementRef<HTMLInputElement>>('field');
  protected readonly text = signal('');

  constructor() {
    afterNextRender(() => this.field().nativeElement.focus({ preventScroll: true }));
  }

  /** Adds the note when it has text (also the page's Enter key). */
  add(): void {
    const text = this.text().trim();
    if (text) this.added.emit(text);
  }
}
