import type { Migration } from '../migration';

/**
 * Indexes for the Samples screen's sorts (`GET /api/samples?sort=…&direction=…`). Each sort reads
 * `WHERE siteId = ? AND deletedAt IS NULL` in one index's order, forwards for ascending and
 * backwards for descending, so a page never sorts the site's rows:
 * - code: `(siteId, deletedAt, code)`;
 * - wet mass: `(siteId, deletedAt, wetMassKg, collectedAt DESC, code)`. An unknown mass sorts as the
 *   smallest (`ASC NULLS FIRST`); that is where SQLite keeps NULLs in an index anyway, and
 *   PostgreSQL is told so in the key, since its own default puts them last;
 * - pile code: each pile's samples newest first, `(pileId, deletedAt, collectedAt DESC, code)`,
 *   which also serves a pile's own list (`?pileId=`), read so far through `samples(pileId)` and sorted;
 * - type and collected date already have theirs (0007).
 * Portable: addIndex only.
 */
export const sampleSortIndexes: Migration = {
  name: '0009-sample-sort-indexes',
  async up(queryInterface, dialect) {
    const newestFirst = { name: 'collectedAt', order: 'DESC' } as const;
    // Sequelize's types name only ASC and DESC; it writes the key's order text as given.
    const massSmallestFirst = { name: 'wetMassKg', order: (dialect === 'postgres' ? 'ASC NULLS FIRST' : 'ASC') as 'ASC' };
    await queryInterface.addIndex('samples', { name: 'samples_site_live_code', fields: ['siteId', 'deletedAt', 'code'] });
    await queryInterface.addIndex('samples', { name: 'samples_site_live_mass_collected_code', fields: ['siteId', 'deletedAt', massSmallestFirst, newestFirst, 'code'] });
    await queryInterface.addIndex('samples', { name: 'samples_pile_live_collected_code', fields: ['pileId', 'deletedAt', newestFirst, 'code'] });
  },
  async down(queryInterface) {
    await queryInterface.removeIndex('samples', 'samples_pile_live_collected_code');
    await queryInterface.removeIndex('samples', 'samples_site_live_mass_collected_code');
    await queryInterface.removeIndex('samples', 'samples_site_live_code');
  },
};
