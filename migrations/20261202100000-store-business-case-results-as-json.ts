import type { Migration } from '../server/lib/migrator.js';

/**
 * A business case's results are written once, never queried inside by SQL, and read back whole as
 * text (GET /api/cases/:id sends them as stored). `json` keeps that text as given; `jsonb` parsed
 * every generated case into its binary form first: for a 10,000-motor site (7.8 MB) about 450 ms of
 * the insert against 200 ms (tests/bench/cases.bench.ts). `inputs` stays jsonb: the report digest
 * reads inside it.
 */
export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.sequelize.query('ALTER TABLE business_cases ALTER COLUMN results TYPE json USING results::json');
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.sequelize.query('ALTER TABLE business_cases ALTER COLUMN results TYPE jsonb USING results::jsonb');
};
