import type { Role } from '../../../../shared/accounts/roles';

/** One destination in the shell's navigation (side rail on wide screens, bottom bar on phones). */
export interface NavItem {
  readonly path: string;
  readonly label: string;
  readonly icon: string;
  /** Roles that see the item; every role when absent. The server still decides what each may do. */
  readonly roles?: readonly Role[];
  /** Shown in the phone's bottom bar; the rest live behind "More". */
  readonly isPrimaryOnPhone?: boolean;
}

/** The screens of DESIGN §3, in the order crews and reviewers use them. Add a line when a screen lands. */
export const NAV_ITEMS: readonly NavItem[] = [
  { path: '/capture', label: 'Capture', icon: 'add_location_alt', isPrimaryOnPhone: true },
  { path: '/safety', label: 'Safety', icon: 'health_and_safety', isPrimaryOnPhone: true },
];

/** The items a user with this role sees (all items for a signed-out user, who sees only public pages). */
export function navItemsFor(role: Role | null, items: readonly NavItem[] = NAV_ITEMS): NavItem[] {
  return items.filter((item) => !item.roles || (role !== null && item.roles.includes(role)));
}
