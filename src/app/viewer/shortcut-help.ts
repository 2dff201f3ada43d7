import { ChangeDetectionStrategy, Component, output } from '@angular/core';
import { MatIconButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { SHORTCUT_HELP } from './shortcuts';

/** The keyboard scheme, from the same table the key handler reads. */
@Component({
  selector: 'ef-shortcut-help',
  imports: [MatIcon, MatIconButton],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="panel" role="dialog" aria-labelledby="shortcut-heading">
      <div class="head">
        <h2 id="shortcut-heading">Keyboard and pointer</h2>
        <button mat-icon-button type="button" aria-label="Close the shortcut list" (click)="closed.emit()">
          <mat-icon>close</mat-icon>
        </button>
      </div>
      <dl>
        @for (row of rows; track row.keys) {
          <dt><kbd>{{ row.keys }}</kbd></dt>
          <dd>{{ row.what }}</dd>
        }
      </dl>
      <p class="hint">Drag with the middle or right button, or hold Space, to pan with any tool.</p>
    </section>
  `,
  styles: `
    .panel {
      width: 420px;
      max-height: 70vh;
      overflow: auto;
      padding: 12px 16px 16px;
      border-radius: var(--mat-sys-corner-medium);
      background: var(--mat-sys-surface-container-high);
      color: var(--mat-sys-on-surface);
      box-shadow: var(--mat-sys-level3);
      font: var(--mat-sys-body-small);
    }
    .head {
      display: flex;
      align-items: center;
      justify-content: space-between;
    }
    h2 {
      margin: 0;
      font: var(--mat-sys-title-small);
    }
    dl {
      display: grid;
      grid-template-columns: max-content 1fr;
      gap: 6px 12px;
      margin: 8px 0;
    }
    dd {
      margin: 0;
    }
    kbd {
      padding: 1px 6px;
      border: 1px solid var(--mat-sys-outline);
      border-radius: 4px;
      font-family: var(--ef-mono);
      font-size: 11px;
      white-space: nowrap;
    }
    .hint {
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class ShortcutHelp {
  readonly closed = output<void>();

  protected readonly rows = SHORTCUT_HELP;
}
