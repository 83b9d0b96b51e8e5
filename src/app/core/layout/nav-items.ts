import type { Role } from '../../../../shared/accounts/roles';

/** One destination in the shell's navigation (side rail on wide screens, bottom bar on phones). */
export interface NavItem {
  readonly path: string;
  /** Translation key of the screen's name (`common.nav.*`). */
  readonly labelKey: string;
  readonly icon: string;
  /** Roles that see the item; every role when absent. The server still decides what each may do. */
  readonly roles?: readonly Role[];
  /** Shown only to a visitor who is not signed in (the sign-in page). */
  readonly isForSignedOut?: boolean;
  /** Shown in the phone's bottom bar; the rest live behind "More". */
  readonly isPrimaryOnPhone?: boolean;
}

const EVERY_ROLE: readonly Role[] = ['sampler', 'geologist', 'lab', 'manager', 'admin'];
/** Everyone who reads a site's piles and samples (not the lab). */
const SITE_READERS: readonly Role[] = ['sampler', 'geologist', 'manager', 'admin'];

/** The screens of DESIGN §3, in the order crews and reviewers use them. Add a line when a screen lands. */
export const NAV_ITEMS: readonly NavItem[] = [
  { path: '/capture', labelKey: 'common.nav.capture', icon: 'add_location_alt', isPrimaryOnPhone: true },
  { path: '/sync', labelKey: 'common.nav.sync', icon: 'sync', isPrimaryOnPhone: true },
  { path: '/site-map', labelKey: 'common.nav.siteMap', icon: 'map', roles: SITE_READERS },
  { path: '/piles', labelKey: 'common.nav.piles', icon: 'landscape', roles: SITE_READERS },
  { path: '/samples', labelKey: 'common.nav.samples', icon: 'science', roles: SITE_READERS },
  { path: '/sample-mass', labelKey: 'common.nav.sampleMass', icon: 'scale', roles: SITE_READERS },
  { path: '/labels', labelKey: 'common.nav.labels', icon: 'qr_code', roles: ['sampler', 'geologist'] },
  { path: '/lab-batches', labelKey: 'common.nav.labBatches', icon: 'biotech', roles: ['geologist', 'lab'] },
  { path: '/qaqc', labelKey: 'common.nav.qaqc', icon: 'rule', roles: ['geologist'] },
  { path: '/trials', labelKey: 'common.nav.trials', icon: 'vibration', roles: ['manager', 'geologist'] },
  { path: '/shortlist', labelKey: 'common.nav.shortlist', icon: 'leaderboard', roles: ['manager', 'admin'] },
  { path: '/safety', labelKey: 'common.nav.safety', icon: 'health_and_safety', isPrimaryOnPhone: true },
  { path: '/people', labelKey: 'common.nav.people', icon: 'group', roles: ['admin'] },
  { path: '/outbox', labelKey: 'common.nav.outbox', icon: 'outgoing_mail', roles: ['admin'] },
  { path: '/profile', labelKey: 'common.nav.profile', icon: 'account_circle', roles: EVERY_ROLE },
  { path: '/sign-in', labelKey: 'common.nav.signIn', icon: 'login', isForSignedOut: true, isPrimaryOnPhone: true },
];

/** The items a user with this role sees (a signed-out visitor sees the open screens and Sign in). */
export function navItemsFor(role: Role | null, items: readonly NavItem[] = NAV_ITEMS): NavItem[] {
  return items.filter((item) =>
    item.isForSignedOut ? role === null : !item.roles || (role !== null && item.roles.includes(role)),
  );
}
