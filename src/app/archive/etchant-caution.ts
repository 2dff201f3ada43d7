import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIcon } from '@angular/material/icon';
import { ETCHANT_CAUTION } from '../../../shared/archive/specimens';

/** The chemical-safety caution shown wherever an etchant is named. */
@Component({
  selector: 'ef-etchant-caution',
  imports: [MatIcon],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <aside class="caution" role="note" aria-label="Etchant safety caution">
      <mat-icon aria-hidden="true">warning</mat-icon>
      <div>
        @if (etchant()) {
          <strong>Etchant: {{ etchant() }}</strong>
        }
        <p>{{ text }}</p>
      </div>
    </aside>
  `,
  styles: `
    :host {
      display: block;
    }
    .caution {
      display: flex;
      align-items: flex-start;
      gap: 12px;
      padding: 12px 16px;
      border-radius: var(--mat-sys-corner-small);
      border-left: 4px solid var(--mat-sys-tertiary);
      background: var(--mat-sys-tertiary-container);
      color: var(--mat-sys-on-tertiary-container);
    }
    mat-icon {
      flex: none;
      color: var(--mat-sys-tertiary);
    }
    strong {
      font: var(--mat-sys-title-small);
    }
    p {
      margin: 2px 0 0;
      font: var(--mat-sys-body-medium);
    }
  `,
})
export class EtchantCaution {
  /** The etchant as recorded, named in the box; empty shows the caution alone. */
  readonly etchant = input('');

  protected readonly text = ETCHANT_CAUTION;
}
