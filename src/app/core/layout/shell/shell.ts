import { DOCUMENT, Component, computed, inject, signal } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { TranslocoPipe } from '@jsverse/transloco';
import { LanguagePicker } from '../../../i18n/language-picker/language-picker';
import { AuthSession } from '../../auth/auth-session';
import { ConnectivityStatus } from '../connectivity-status';
import { DisplayMode } from '../display-mode';
import { NAV_ITEMS, navItemsFor } from '../nav-items';

/** Phones and small tablets in portrait get the bottom bar; wider screens a side rail. */
const PHONE_QUERY = '(max-width: 759.98px)';
/** A bottom bar holds at most this many destinations before they crowd a 360 px screen. */
const MAX_BOTTOM_ITEMS = 4;

/**
 * The app frame: toolbar, navigation (side rail on wide screens, bottom bar plus a "More" drawer
 * on phones) and the routed page. Plain elements rather than Material's sidenav and list keep the
 * first download small for phones on slow camp Wi-Fi.
 */
@Component({
  selector: 'hs-shell',
  imports: [MatIconModule, RouterOutlet, RouterLink, RouterLinkActive, TranslocoPipe, LanguagePicker],
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
  host: { '(document:keydown.escape)': 'closeDrawer()' },
})
export class Shell {
  private readonly session = inject(AuthSession);
  protected readonly displayMode = inject(DisplayMode);
  protected readonly connectivity = inject(ConnectivityStatus);

  protected readonly isPhone = signal(false);
  protected readonly isDrawerOpen = signal(false);
  protected readonly items = computed(() => navItemsFor(this.session.user()?.role ?? null, NAV_ITEMS));
  protected readonly bottomItems = computed(() =>
    this.items().filter((item) => item.isPrimaryOnPhone).slice(0, MAX_BOTTOM_ITEMS),
  );
  protected readonly user = this.session.user;

  constructor() {
    const query = inject(DOCUMENT).defaultView?.matchMedia?.(PHONE_QUERY);
    if (query) {
      this.isPhone.set(query.matches);
      query.addEventListener('change', (event) => {
        this.isPhone.set(event.matches);
        this.isDrawerOpen.set(false);
      });
    }
  }

  protected toggleDrawer(): void {
    this.isDrawerOpen.update((isOpen) => !isOpen);
  }

  protected closeDrawer(): void {
    this.isDrawerOpen.set(false);
  }
}
