import type { Migration } from '../server/lib/migrator.js';

/** A retrofit approved through a business case that had no proposal yet is logged with source 'case'. */
export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.sequelize.query(`ALTER TYPE "enum_retrofits_source" ADD VALUE IF NOT EXISTS 'case'`);
};

/** PostgreSQL cannot drop an enum value: the type is rebuilt without it; 'case' rows become 'manual'. */
export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.sequelize.query(`
    UPDATE retrofits SET source = 'manual' WHERE source = 'case';
    ALTER TYPE "enum_retrofits_source" RENAME TO "enum_retrofits_source_old";
    CREATE TYPE "enum_retrofits_source" AS ENUM ('screening', 'study', 'manual');
    ALTER TABLE retrofits ALTER COLUMN source TYPE "enum_retrofits_source" USING source::text::"enum_retrofits_source";
    DROP TYPE "enum_retrofits_source_old";
  `);
};
