import type { Migration } from '../server/lib/migrator.js';

// The table connect-pg-simple expects (its own table.sql), created here so the schema has one owner.
export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.sequelize.query(`
    CREATE TABLE "session" (
      "sid" varchar NOT NULL COLLATE "default" PRIMARY KEY,
      "sess" json NOT NULL,
      "expire" timestamp(6) NOT NULL
    );
    CREATE INDEX "IDX_session_expire" ON "session" ("expire");
  `);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('session', {});
};
