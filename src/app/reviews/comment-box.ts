import { ChangeDetectionStrategy, Component, computed, ElementRef, input, output, signal, viewChild } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatAutocomplete, MatAutocompleteSelectedEvent, MatAutocompleteTrigger } from '@angular/material/autocomplete';
import { MatOption } from '@angular/material/core';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import type { PersonRef } from '../../../shared/reviews';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { insertMention, matchMembers, mentionedIds, mentionQueryAt } from './mentions';

/** A project member the box can suggest after an @. */
export interface Mentionable extends PersonRef {
  email: string;
}

/** What the box hands over: the text and the ids of the members it still mentions. */
export interface CommentDraft {
  body: string;
  mentions: string[];
}

const BODY_MAX = 5000;

/** A comment field that suggests project members after "@" and keeps the chosen ones' ids. */
@Component({
  selector: 'ef-comment-box',
  imports: [MatAutocomplete, MatAutocompleteTrigger, MatError, MatFormField, MatHint, MatInput, MatLabel, MatOption, ReactiveFormsModule, ValidationMessagePipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <mat-form-field subscriptSizing="dynamic">
      <mat-label>{{ label() }}</mat-label>
      <textarea
        #field
        matInput
        rows="3"
        [formControl]="text"
        [matAutocomplete]="people"
        (input)="trackCaret()"
        (click)="trackCaret()"
        (keyup)="trackCaret()"
      ></textarea>
      <mat-hint>Type &#64; and a name to notify a project member.</mat-hint>
      <mat-error>{{ text.errors | validationMessage }}</mat-error>
    </mat-form-field>
    <mat-autocomplete #people="matAutocomplete" (optionSelected)="chooseMember($event)">
      @for (m of suggestions(); track m.id) {
        <mat-option [value]="m.id">
          {{ m.name }} <small class="email">{{ m.email }}</small>
        </mat-option>
      }
    </mat-autocomplete>
  `,
  styles: `
    :host {
      display: block;
    }
    mat-form-field {
      width: 100%;
    }
    .email {
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class CommentBox {
  readonly label = input('Comment');
  readonly members = input<readonly Mentionable[]>([]);

  private readonly field = viewChild.required<ElementRef<HTMLTextAreaElement>>('field');

  protected readonly text = new FormControl('', {
    nonNullable: true,
    validators: [Validators.maxLength(BODY_MAX)],
  });
  private readonly typed = signal('');
  private readonly caret = signal(0);
  private readonly chosen = signal<PersonRef[]>([]);
  private readonly query = computed(() => mentionQueryAt(this.typed(), this.caret()));
  protected readonly suggestions = computed(() => {
    const q = this.query();
    return q ? matchMembers(this.members(), q.query) : [];
  });

  /** The draft, or null (and the field marked) when it is empty or too long. */
  draft(): CommentDraft | null {
    this.text.markAsTouched();
    const body = this.text.value.trim();
    if (this.text.invalid || body === '') {
      if (body === '') this.text.setErrors({ server: 'Write something first; the comment is empty.' });
      return null;
    }
    return { body, mentions: mentionedIds(body, this.chosen()) };
  }

  /** Empties the box after the comment was sent. */
  clear(): void {
    this.text.reset('');
    this.typed.set('');
    this.chosen.set([]);
  }

  /** Puts the server's message about the body under the field. */
  showError(message: string): void {
    this.text.setErrors({ server: message });
    this.text.markAsTouched();
  }

  protected trackCaret(): void {
    const el = this.field().nativeElement;
    this.typed.set(el.value);
    this.caret.set(el.selectionStart ?? el.value.length);
  }

  protected chooseMember(event: MatAutocompleteSelectedEvent): void {
    const member = this.members().find((m) => m.id === event.option.value);
    const q = this.query();
    if (!member || !q) return;
    const next = insertMention(this.typed(), q, this.caret(), member.name);
    // The trigger has just written the option's value into the field; put the whole text back.
    this.text.setValue(next.text);
    this.typed.set(next.text);
    this.caret.set(next.caret);
    this.chosen.update((list) => (list.some((p) => p.id === member.id) ? list : [...list, { id: member.id, name: member.name }]));
    const el = this.field().nativeElement;
    el.value = next.text;
    el.setSelectionRange(next.caret, next.caret);
  }
}
