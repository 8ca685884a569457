import type { Migration } from '../server/lib/migrator.js';

/**
 * A trigram index over the text the register's `q` searches (tag, description, area, manufacturer).
 * server/motors/filters.ts builds the very same expression (keep them equal), so the planner can use the index.
 */
const MOTOR_SEARCH_EXPRESSION =
  "lower(tag || ' ' || coalesce(description, '') || ' ' || coalesce(area, '') || ' ' || coalesce(manufacturer, ''))";

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.sequelize.query(`CREATE INDEX motors_search_trgm ON motors USING gin ((${MOTOR_SEARCH_EXPRESSION}) gin_trgm_ops)`);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.sequelize.query('DROP INDEX IF EXISTS motors_search_trgm');
};
