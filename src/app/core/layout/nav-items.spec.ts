import { navItemsFor, type NavItem } from './nav-items';

const items: NavItem[] = [
  { path: '/capture', label: 'Capture', icon: 'add' },
  { path: '/people', label: 'People & sites', icon: 'group', roles: ['admin'] },
  { path: '/shortlist', label: 'Shortlist', icon: 'leaderboard', roles: ['manager', 'admin'] },
];

describe('navItemsFor', () => {
  it('shows a role only the screens meant for it', () => {
    expect(navItemsFor('manager', items).map((item) => item.label)).toEqual(['Capture', 'Shortlist']);
    expect(navItemsFor('admin', items).map((item) => item.label)).toEqual(['Capture', 'People & sites', 'Shortlist']);
  });

  it('shows a signed-out visitor only the open screens', () => {
    expect(navItemsFor(null, items).map((item) => item.label)).toEqual(['Capture']);
  });
});
