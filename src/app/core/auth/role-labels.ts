import type { Role } from '../../../../shared/accounts/roles';

/** How each role is named on screen, with an icon to read it at a glance. */
export const ROLE_LABELS: Record<Role, { readonly label: string; readonly icon: string }> = {
  sampler: { label: 'Sampler (field crew)', icon: 'hiking' },
  geologist: { label: 'Geologist', icon: 'terrain' },
  lab: { label: 'Lab contact', icon: 'science' },
  manager: { label: 'Manager', icon: 'payments' },
  admin: { label: 'Admin', icon: 'admin_panel_settings' },
};
