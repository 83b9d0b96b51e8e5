import type { Role } from '../../../../shared/accounts/roles';

/** How each role is named on screen (a translation key), with an icon to read it at a glance. */
export const ROLE_LABELS: Record<Role, { readonly label: string; readonly icon: string }> = {
  sampler: { label: 'common.roles.sampler', icon: 'hiking' },
  geologist: { label: 'common.roles.geologist', icon: 'terrain' },
  lab: { label: 'common.roles.lab', icon: 'science' },
  manager: { label: 'common.roles.manager', icon: 'payments' },
  admin: { label: 'common.roles.admin', icon: 'admin_panel_settings' },
};
