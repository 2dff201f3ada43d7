import { ChangeDetectionStrategy, Component, ViewEncapsulation } from '@angular/core';

/**
 * Placed on printable pages: when printing, the app bar and the navigation drawer are hidden
 * and the content takes the page. Unencapsulated on purpose: it styles the shell around the page.
 */
@Component({
  selector: 'ef-print-frame',
  template: '',
  encapsulation: ViewEncapsulation.None,
  changeDetection: ChangeDetectionStrategy.OnPush,
  styles: `
    @media print {
      .ef-app-bar, .skip-link, mat-sidenav, .mat-drawer { display: none !important; }
      .mat-drawer-content, mat-sidenav-content { margin: 0 !important; transition: none !important; }
      .mat-drawer-container, mat-sidenav-container { position: static !important; overflow: visible !important; height: auto !important; }
      /* The shell fills the window and scrolls inside it; printed, the page must flow over as many sheets as it needs. */
      html, body, ef-shell { height: auto !important; overflow: visible !important; }
      ef-shell { display: block !important; }
      .mat-drawer-content, mat-sidenav-content { overflow: visible !important; height: auto !important; }
    }
  `,
})
export class PrintFrame {}
