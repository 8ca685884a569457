/** `npm run migrate [-- down]`: applies pending migrations, or reverts the last one. */
import { openDatabase } from '../lib/bootstrap.js';
import { loadConfig } from '../lib/config.js';
import { migrator } from '../lib/migrator.js';

const database = await openDatabase(loadConfig(), { migrate: false });
try {
  const umzug = migrator(database.sequelize);
  const done = process.argv[2] === 'down' ? await umzug.down() : await umzug.up();
  process.stdout.write(`${process.argv[2] === 'down' ? 'reverted' : 'applied'}: ${done.map((m) => m.name).join(', ') || 'nothing'}\n`);
} finally {
  await database.close();
}
