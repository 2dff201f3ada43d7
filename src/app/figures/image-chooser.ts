import { ChangeDetectionStrategy, Component, inject, input, output, signal } from '@angular/core';
import { toObservable } from '@angular/core/rxjs-interop';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import type { ImageSummary } from '../../../shared/images';
import { ImageApi } from '../archive/image-api';
import { remote } from '../core/remote';
import { typedSearch } from '../core/typed-search';

/** Ready images of the project, searched by name, as thumbnails to pick one from. */
@Component({
  selector: 'ef-image-chooser',
  imports: [MatFormField, MatInput, MatLabel, MatProgressBar],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <mat-form-field class="search" subscriptSizing="dynamic">
      <mat-label>{{ label() }}</mat-label>
      <input matInput type="search" [value]="text()" (input)="text.set($any($event.target).value)" placeholder="Search by file name" />
    </mat-form-field>
    <div class="progress-slot">
      @if (images.loading()) {
        <mat-progress-bar mode="indeterminate" aria-label="Searching images" />
      }
    </div>
    @if (images.error(); as error) {
      <p class="problem" role="alert">{{ error }} <button type="button" class="link" (click)="images.reload()">Try again</button></p>
    } @else if (images.value(); as page) {
      @if (page.items.length === 0) {
        <p class="empty">No ready images match “{{ query() }}”.</p>
      } @else {
        <ul class="grid" [attr.aria-label]="listLabel()">
          @for (image of page.items; track image.id) {
            <li>
              <button type="button" class="pick" [class.chosen]="image.id === chosenId()" [attr.aria-pressed]="image.id === chosenId()" (click)="picked.emit(image)">
                <img [src]="thumbnailUrl(image)" alt="" loading="lazy" />
                <span class="name">{{ image.originalName }}</span>
                @if (image.pixelSize.xUm === null) {
                  <span class="uncalibrated">no pixel size: no scale bar</span>
                }
              </button>
            </li>
          }
        </ul>
        @if (page.total > page.items.length) {
          <p class="more">Showing {{ page.items.length }} of {{ page.total }}; narrow the search to see others.</p>
        }
      }
    }
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 6px;
    }
    .search {
      width: 100%;
    }
    .progress-slot {
      height: 4px;
    }
    .grid {
      list-style: none;
      margin: 0;
      padding: 0;
      display: grid;
      grid-template-columns: repeat(auto-fill, minmax(96px, 1fr));
      gap: 8px;
      max-height: 260px;
      overflow-y: auto;
    }
    .pick {
      display: flex;
      flex-direction: column;
      gap: 4px;
      width: 100%;
      padding: 4px;
      border: 2px solid transparent;
      border-radius: var(--mat-sys-corner-small);
      background: var(--mat-sys-surface-container);
      color: inherit;
      cursor: pointer;
      text-align: left;
    }
    .pick.chosen {
      border-color: var(--mat-sys-primary);
    }
    .pick:focus-visible {
      outline: 2px solid var(--mat-sys-primary);
    }
    .pick img {
      width: 100%;
      aspect-ratio: 4 / 3;
      object-fit: cover;
      background: var(--mat-sys-surface-container-highest);
    }
    .name {
      font: var(--mat-sys-label-small);
      overflow-wrap: anywhere;
    }
    .uncalibrated {
      font: var(--mat-sys-label-small);
      color: var(--mat-sys-error);
    }
    .empty,
    .more,
    .problem {
      margin: 0;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
    .problem {
      color: var(--mat-sys-error);
    }
    .link {
      border: 0;
      background: none;
      color: var(--mat-sys-primary);
      text-decoration: underline;
      cursor: pointer;
    }
  `,
})
export class ImageChooser {
  private readonly api = inject(ImageApi);

  readonly projectId = input.required<string>();
  /** The accessible name of the search field, e.g. "Panel 2 image". */
  readonly label = input.required<string>();
  /** The accessible name of the thumbnail list, e.g. "Images to choose for panel 2". */
  readonly listLabel = input.required<string>();
  readonly chosenId = input<string | null>(null);
  readonly picked = output<ImageSummary>();

  protected readonly text = signal('');
  protected readonly query = typedSearch(toObservable(this.text));
  protected readonly images = remote(
    () => ({ projectId: this.projectId(), q: this.query() }),
    ({ projectId, q }) => this.api.search(projectId, { page: 0, pageSize: 24, sort: 'uploadedAt', dir: 'desc', q: q || undefined, state: ['ready'] }),
  );

  protected thumbnailUrl(image: ImageSummary): string {
    return this.api.thumbnailUrl(this.projectId(), image.id);
  }
}
