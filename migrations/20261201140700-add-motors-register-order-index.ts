import type { Migration } from '../server/lib/migrator.js';

/**
 * The register's default order is (tag, id) within an organisation: with this index the first page
 * of a filtered list is read in order and stops after a page of matches, instead of sorting them all.
 */
export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.addIndex('motors', ['organization_id', 'tag', 'id'], { name: 'motors_register_order' });
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.removeIndex('motors', 'motors_register_order');
};
