import type { Role } from '../../../../shared/accounts/roles';

/** One destination in the shell's navigation (side rail on wide screens, bottom bar on phones). */
export interface NavItem {
  readonly path: string;
  readonly label: string;
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
  { path: '/capture', label: 'Capture', icon: 'add_location_alt', isPrimaryOnPhone: true },
  { path: '/sync', label: 'Sync', icon: 'sync', isPrimaryOnPhone: true },
  { path: '/site-map', label: 'Site map', icon: 'map', roles: SITE_READERS },
  { path: '/piles', label: 'Piles', icon: 'landscape', roles: SITE_READERS },
  { path: '/samples', label: 'Samples', icon: 'science', roles: SITE_READERS },
  { path: '/sample-mass', label: 'Sample mass', icon: 'scale', roles: SITE_READERS },
  { path: '/labels', label: 'Labels', icon: 'qr_code', roles: ['sampler', 'geologist'] },
  { path: '/lab-batches', label: 'Lab batches', icon: 'biotech', roles: ['geologist', 'lab'] },
  { path: '/qaqc', label: 'QA/QC', icon: 'rule', roles: ['geologist'] },
  { path: '/trials', label: 'Trials', icon: 'vibration', roles: ['manager', 'geologist'] },
  { path: '/shortlist', label: 'Shortlist', icon: 'leaderboard', roles: ['manager', 'admin'] },
  { path: '/safety', label: 'Safety', icon: 'health_and_safety', isPrimaryOnPhone: true },
  { path: '/people', label: 'People & sites', icon: 'group', roles: ['admin'] },
  { path: '/outbox', label: 'Outbox', icon: 'outgoing_mail', roles: ['admin'] },
  { path: '/profile', label: 'Profile', icon: 'account_circle', roles: EVERY_ROLE },
  { path: '/sign-in', label: 'Sign in', icon: 'login', isForSignedOut: true, isPrimaryOnPhone: true },
];

/** The items a user with this role sees (a signed-out visitor sees the open screens and Sign in). */
export function navItemsFor(role: Role | null, items: readonly NavItem[] = NAV_ITEMS): NavItem[] {
  return items.filter((item) =>
    item.isForSignedOut ? role === null : !item.roles || (role !== null && item.roles.includes(role)),
  );
}
