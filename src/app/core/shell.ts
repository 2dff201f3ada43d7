import { BreakpointObserver } from '@angular/cdk/layout';
import { ChangeDetectionStrategy, Component, computed, inject, viewChild } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatListItem, MatListItemIcon, MatListItemTitle, MatListSubheaderCssMatStyler, MatNavList } from '@angular/material/list';
import { MatMenu, MatMenuItem, MatMenuTrigger } from '@angular/material/menu';
import { MatSidenav, MatSidenavContainer, MatSidenavContent } from '@angular/material/sidenav';
import { MatToolbar } from '@angular/material/toolbar';
import { Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { catchError, map, of } from 'rxjs';
import { HealthApi } from './health-api';
import { SessionStore } from './session-store';

/** Below this width the navigation slides over the page instead of sitting beside it. */
const COMPACT_QUERY = '(max-width: 839.98px)';

/** The frame around every signed-in page: app bar, account menu and navigation. */
@Component({
  selector: 'ef-shell',
  imports: [
    MatButton,
    MatIcon,
    MatIconButton,
    MatListItem,
    MatListItemIcon,
    MatListItemTitle,
    MatListSubheaderCssMatStyler,
    MatMenu,
    MatMenuItem,
    MatMenuTrigger,
    MatNavList,
    MatSidenav,
    MatSidenavContainer,
    MatSidenavContent,
    MatToolbar,
    RouterLink,
    RouterLinkActive,
    RouterOutlet,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
})
export class Shell {
  private readonly session = inject(SessionStore);
  private readonly router = inject(Router);
  private readonly breakpoints = inject(BreakpointObserver);
  private readonly healthApi = inject(HealthApi);

  private readonly drawer = viewChild.required(MatSidenav);

  protected readonly user = this.session.user;
  protected readonly isAdmin = this.session.isAdmin;
  protected readonly isLocalMode = this.session.isLocalMode;
  protected readonly compact = toSignal(this.breakpoints.observe(COMPACT_QUERY).pipe(map((state) => state.matches)), {
    initialValue: false,
  });
  protected readonly drawerMode = computed(() => (this.compact() ? 'over' : 'side'));
  protected readonly health = toSignal(this.healthApi.get().pipe(catchError(() => of(null))), { initialValue: null });
  protected readonly versionLine = computed(() => {
    const health = this.health();
    if (!health) return '';
    return `Version ${health.version}${health.mode === 'local' ? ' · local mode' : ''}`;
  });
  protected readonly databaseDown = computed(() => this.health()?.database === 'down');

  /** On small screens the drawer covers the page, so get it out of the way after choosing. */
  protected closeDrawerIfCompact(): void {
    if (this.compact()) void this.drawer().close();
  }

  protected toggleDrawer(): void {
    void this.drawer().toggle();
  }

  protected async signOut(): Promise<void> {
    await this.session.signOut();
    await this.router.navigate(['/sign-in']);
  }
}
