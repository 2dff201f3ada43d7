import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatAnchor } from '@angular/material/button';
import { RouterLink } from '@angular/router';

/** Shown for any address the app does not know. */
@Component({
  selector: 'ef-not-found',
  imports: [MatAnchor, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <main class="page">
      <h1>Page not found</h1>
      <p>Nothing is filed at this address. It may have moved, or the link may be mistyped.</p>
      <a mat-flat-button routerLink="/projects">Go to projects</a>
    </main>
  `,
  styles: `
    .page {
      max-width: 36rem;
      margin: 15vh auto 0;
      padding: 0 24px;
    }
    h1 {
      font: var(--mat-sys-headline-medium);
    }
    p {
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export default class NotFound {}
