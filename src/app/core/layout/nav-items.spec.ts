import { NAV_ITEMS, navItemsFor, type NavItem } from './nav-items';

const items: NavItem[] = [
  { path: '/capture', labelKey: 'common.nav.capture', icon: 'add' },
  { path: '/people', labelKey: 'common.nav.people', icon: 'group', roles: ['admin'] },
  { path: '/shortlist', labelKey: 'common.nav.shortlist', icon: 'leaderboard', roles: ['manager', 'admin'] },
  { path: '/sign-in', labelKey: 'common.nav.signIn', icon: 'login', isForSignedOut: true },
];

describe('navItemsFor', () => {
  it('shows a role only the screens meant for it', () => {
    expect(navItemsFor('manager', items).map((item) => item.labelKey)).toEqual(['common.nav.capture', 'common.nav.shortlist']);
    expect(navItemsFor('admin', items).map((item) => item.labelKey)).toEqual(['common.nav.capture', 'common.nav.people', 'common.nav.shortlist']);
  });

  it('shows a signed-out visitor only the open screens and the way to sign in', () => {
    expect(navItemsFor(null, items).map((item) => item.labelKey)).toEqual(['common.nav.capture', 'common.nav.signIn']);
  });

  it('keeps People & sites and Outbox for admins, and Profile for every signed-in role', () => {
    const labels = (role: Parameters<typeof navItemsFor>[0]) => navItemsFor(role).map((item) => item.labelKey);
    expect(labels('sampler')).toContain('common.nav.profile');
    expect(labels('sampler')).not.toContain('common.nav.people');
    expect(labels('lab')).not.toContain('common.nav.outbox');
    expect(labels('admin')).toEqual(expect.arrayContaining(['common.nav.people', 'common.nav.outbox', 'common.nav.profile']));
    expect(labels('admin')).not.toContain('common.nav.signIn');
    expect(labels(null)).toContain('common.nav.signIn');
    expect(NAV_ITEMS.filter((item) => item.isPrimaryOnPhone).length).toBeLessThanOrEqual(4);
  });
});
