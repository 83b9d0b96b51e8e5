import type { CurrentUser } from './current-user';
import { assertCan, can, readableSiteIds, rolesWith } from './policy';

const site = 'site-a';
const otherSite = 'site-b';
const person = (role: CurrentUser['role'], overrides: Partial<CurrentUser> = {}): CurrentUser => ({
  id: `${role}-1`, organizationId: 'org', email: `${role}@x.test`, name: role, role, labName: null,
  siteIds: [site], deviceId: null, ...overrides,
});

describe('policy', () => {
  it('lets a sampler write their own records on their own site only', () => {
    const sampler = person('sampler');
    expect(can(sampler, 'capture:write', { siteId: site, ownerId: sampler.id })).toBe(true);
    expect(can(sampler, 'capture:write', { siteId: site, ownerId: 'someone-else' })).toBe(false);
    expect(can(sampler, 'capture:write', { siteId: otherSite, ownerId: sampler.id })).toBe(false);
  });

  it('lets a geologist edit anyone\u2019s records on their sites', () => {
    expect(can(person('geologist'), 'capture:write', { siteId: site, ownerId: 'someone-else' })).toBe(true);
  });

  it('keeps lab users to their own lab\u2019s batches and out of site data', () => {
    const lab = person('lab', { labName: 'Lab One', siteIds: [] });
    expect(can(lab, 'lab:results', { labName: 'Lab One' })).toBe(true);
    expect(can(lab, 'lab:results', { labName: 'Lab Two' })).toBe(false);
    expect(can(lab, 'site:read', { siteId: site })).toBe(false);
    expect(readableSiteIds(lab)).toEqual([]);
  });

  it('lets admins read every site but not capture', () => {
    const admin = person('admin', { siteIds: [] });
    expect(readableSiteIds(admin)).toBe('all');
    expect(can(admin, 'site:read', { siteId: otherSite })).toBe(true);
    expect(can(admin, 'capture:write', { siteId: site })).toBe(false);
  });

  it('refuses with a 403 AppError', () => {
    expect(() => assertCan(person('manager'), 'people:manage')).toThrow(expect.objectContaining({ status: 403, code: 'forbidden' }));
  });

  it('lists who holds a permission', () => {
    expect(rolesWith('economics:manage')).toEqual(['manager']);
  });
});
