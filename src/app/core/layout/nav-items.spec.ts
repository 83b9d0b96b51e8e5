import { NAV_ITEMS, navItemsFor, type NavItem } from './nav-items';

const items: NavItem[] = [
  { path: '/capture', label: 'Capture', icon: 'add' },
  { path: '/people', label: 'People & sites', icon: 'group', roles: ['admin'] },
  { path: '/shortlist', label: 'Shortlist', icon: 'leaderboard', roles: ['manager', 'admin'] },
  { path: '/sign-in', label: 'Sign in', icon: 'login', isForSignedOut: true },
];

describe('navItemsFor', () => {
  it('shows a role only the screens meant for it', () => {
    expect(navItemsFor('manager', items).map((item) => item.label)).toEqual(['Capture', 'Shortlist']);
    expect(navItemsFor('admin', items).map((item) => item.label)).toEqual(['Capture', 'People & sites', 'Shortlist']);
  });

  it('shows a signed-out visitor only the open screens and the way to sign in', () => {
    expect(navItemsFor(null, items).map((item) => item.label)).toEqual(['Capture', 'Sign in']);
  });

  it('keeps People & sites and Outbox for admins, and Profile for every signed-in role', () => {
    const labels = (role: Parameters<typeof navItemsFor>[0]) => navItemsFor(role).map((item) => item.label);
    expect(labels('sampler')).toContain('Profile');
    expect(labels('sampler')).not.toContain('People & sites');
    expect(labels('lab')).not.toContain('Outbox');
    expect(labels('admin')).toEqual(expect.arrayContaining(['People & sites', 'Outbox', 'Profile']));
    expect(labels('admin')).not.toContain('Sign in');
    expect(labels(null)).toContain('Sign in');
    expect(NAV_ITEMS.filter((item) => item.isPrimaryOnPhone).length).toBeLessThanOrEqual(4);
  });
});
