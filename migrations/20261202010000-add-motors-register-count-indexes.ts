import type { Migration } from '../server/lib/migrator.js';

/**
 * The register's total (`SELECT count(*)` with the list's filter) read every motor of the
 * organisation: with 100,000 motors a seq scan of 60–100 ms per list request, the largest cost of the
 * register under load (tests/bench/load.bench.ts). Narrow partial indexes on the usual filters, over
 * motors in service only (the register hides retired ones unless asked), let PostgreSQL count from
 * the index alone (index-only scan once autovacuum has set the visibility map).
 */
const INDEXES = [
  ['motors_active_application', 'application'],
  ['motors_active_efficiency_class', 'efficiency_class'],
  ['motors_active_control_method', 'control_method'],
] as const;

export const up: Migration = async ({ context: queryInterface }) => {
  for (const [name, column] of INDEXES) {
    await queryInterface.sequelize.query(`CREATE INDEX ${name} ON motors (organization_id, ${column}) WHERE status <> 'retired'`);
  }
};

export const down: Migration = async ({ context: queryInterface }) => {
  for (const [name] of INDEXES) await queryInterface.removeIndex('motors', name);
};
