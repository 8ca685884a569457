/**
 * `npm start`: PostgreSQL (private cluster unless DATABASE_URL), migrations, demo seed, the client
 * build when the sources are newer than it, the local mail catcher (unless SMTP_URL), and the app on
 * http://127.0.0.1:3000. Ctrl-C (or SIGTERM) lets requests in flight finish, then stops everything.
 */
import { createApp } from '../app.js';
import { openDatabase } from '../lib/bootstrap.js';
import { buildClientIfStale } from '../lib/client-build.js';
import { loadConfig } from '../lib/config.js';
import { logger } from '../lib/logger.js';
import { startMailCatcher, type MailCatcher } from '../lib/mail-catcher.js';
import { createMailer } from '../lib/mail.js';
import { ClusterError } from '../lib/postgres-cluster.js';
import { recoverInterruptedCommits } from '../intake/service.js';
import { startJobs, stopJobs } from '../jobs/index.js';

async function main(): Promise<void> {
  const config = loadConfig();
  const database = await openDatabase(config, { migrate: true, seed: true });
  // Import commits cut off by a crash or a database restart become committable again (nothing was written).
  const interrupted = await recoverInterruptedCommits();
  if (interrupted.length > 0) logger.warn(`import commit(s) ${interrupted.join(', ')} were interrupted; nothing was written and they can be committed again`);
  let catcher: MailCatcher | undefined;
  try {
    buildClientIfStale(config.clientDir);
    if (!config.smtpUrl) {
      catcher = await startMailCatcher(config.smtpCatcherPort);
      logger.info(`local mail catcher on 127.0.0.1:${catcher.port}: e-mail goes to the Outbox page`);
    }
  } catch (error) {
    // Leave nothing running behind a failed start.
    await database.close();
    throw error;
  }
  const mailer = createMailer({ smtpUrl: config.smtpUrl, catcherPort: catcher?.port ?? config.smtpCatcherPort, from: config.mailFrom });
  if (config.sessionSecretIsRandom) logger.warn('SESSION_SECRET is not set: sessions end when the server restarts.');

  const { app, close: closeApp } = createApp({ config, databaseUrl: database.url, mailer });
  // Background jobs (screenings): this instance takes its share of the PostgreSQL queue.
  await startJobs();
  const server = app.listen(config.port, config.host, () => {
    process.stdout.write(`\nStatorline is ready on http://${config.host}:${config.port}  (Ctrl-C stops it and its database)\n`);
    process.stdout.write('Demo sign-ins: admin@kestrel.example, engineer@kestrel.example, approver@kestrel.example, viewer@kestrel.example — password statorline-demo\n\n');
  });

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    logger.info(`${signal}: stopping — letting requests in flight finish`);
    const forced = setTimeout(() => server.closeAllConnections(), 10_000);
    // The job runner stops claiming at once (its running jobs go back to the queue, resumable) while
    // the HTTP server drains; no request waits on a job, so neither needs the other first.
    await Promise.all([new Promise<void>((resolve) => server.close(() => resolve())), stopJobs()]);
    clearTimeout(forced);
    mailer.close();
    await catcher?.close();
    await closeApp();
    await database.close();
    logger.info('stopped cleanly');
    process.exit(0);
  };
  process.on('SIGINT', () => void stop('SIGINT'));
  process.on('SIGTERM', () => void stop('SIGTERM'));
}

main().catch((error: unknown) => {
  if (error instanceof ClusterError) process.stderr.write(`${error.message}\n`);
  else process.stderr.write(`${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
  process.exit(1);
});
