import type { Migration } from '../server/lib/migrator.js';

/**
 * Trigram matching (PostgreSQL contrib, shipped with Debian's postgresql-15) lets the register's free
 * text search use an index. Creating it needs a superuser or a trusted-extension grant: the private
 * cluster's user has it; on a managed server, create the extension once by hand before migrating.
 */
export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.sequelize.query('CREATE EXTENSION IF NOT EXISTS pg_trgm');
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.sequelize.query('DROP EXTENSION IF EXISTS pg_trgm');
};
