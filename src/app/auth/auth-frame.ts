import { ChangeDetectionStrategy, Component } from '@angular/core';

/** The quiet page around sign-in and password forms: the mark, then the cards. */
@Component({
  selector: 'ef-auth-frame',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <main class="frame">
      <p class="brand">
        <img src="favicon.svg" alt="" width="36" height="36" />
        <span>Etchfile</span>
      </p>
      <ng-content />
      <p class="tagline">Archive, viewer, measuring bench and review desk for micrographs.</p>
    </main>
  `,
  styles: `
    :host {
      display: block;
      min-height: 100dvh;
      background: var(--mat-sys-surface-container-low);
    }
    .frame {
      display: flex;
      flex-direction: column;
      gap: 16px;
      max-width: 440px;
      margin: 0 auto;
      padding: 8vh 16px 32px;
    }
    .brand {
      display: flex;
      align-items: center;
      gap: 12px;
      margin: 0 0 8px;
      font: var(--mat-sys-headline-small);
      color: var(--mat-sys-primary);
    }
    .tagline {
      margin: 8px 0 0;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class AuthFrame {}
