import { BreakpointObserver } from '@angular/cdk/layout';
import { Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatSidenavModule } from '@angular/material/sidenav';
import { MatToolbarModule } from '@angular/material/toolbar';
import { RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { map } from 'rxjs';
import { AuthSession } from '../../auth/auth-session';
import { DisplayMode } from '../display-mode';
import { NAV_ITEMS, navItemsFor } from '../nav-items';
import { ConnectivityStatus } from '../connectivity-status';

/** Phones and small tablets in portrait get the bottom bar; wider screens a side rail. */
const PHONE_QUERY = '(max-width: 759.98px)';
/** A bottom bar holds at most this many destinations before they crowd a 360 px screen. */
const MAX_BOTTOM_ITEMS = 4;

/** The app frame: toolbar, navigation (side rail or bottom bar) and the routed page. */
@Component({
  selector: 'hs-shell',
  imports: [
    MatToolbarModule, MatSidenavModule, MatListModule, MatIconModule, MatButtonModule,
    RouterOutlet, RouterLink, RouterLinkActive,
  ],
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
})
export class Shell {
  private readonly session = inject(AuthSession);
  protected readonly displayMode = inject(DisplayMode);
  protected readonly connectivity = inject(ConnectivityStatus);

  protected readonly isPhone = toSignal(
    inject(BreakpointObserver).observe(PHONE_QUERY).pipe(map((state) => state.matches)),
    { initialValue: false },
  );
  protected readonly items = computed(() => navItemsFor(this.session.user()?.role ?? null, NAV_ITEMS));
  protected readonly bottomItems = computed(() =>
    this.items().filter((item) => item.isPrimaryOnPhone).slice(0, MAX_BOTTOM_ITEMS),
  );
  protected readonly user = this.session.user;
}
