/** `npm run seed [-- down]`: inserts the demo scenario, or removes exactly its rows. */
import { openDatabase } from '../lib/bootstrap.js';
import { loadConfig } from '../lib/config.js';
import { seeder } from '../lib/migrator.js';

const database = await openDatabase(loadConfig(), { migrate: true });
try {
  const umzug = seeder(database.sequelize);
  const done = process.argv[2] === 'down' ? await umzug.down({ to: 0 }) : await umzug.up();
  process.stdout.write(`${process.argv[2] === 'down' ? 'removed' : 'seeded'}: ${done.map((m) => m.name).join(', ') || 'nothing'}\n`);
} finally {
  await database.close();
}
