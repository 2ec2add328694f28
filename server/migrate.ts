// `npm run migrate`: applies pending migrations to DATABASE_URL and exits. Several processes may
// run it at once: the migrator takes PostgreSQL advisory locks, so one applies, the rest wait.
// Built to dist/server/migrate.js, it runs with production dependencies only.
import { migrateToLatest, migrationFolderFor } from './db/migrator';

const url = process.env.DATABASE_URL;
if (!url) {
  process.stderr.write(
    'Set DATABASE_URL to the database to migrate (npm start migrates its own database itself).\n',
  );
  process.exit(2);
}
try {
  const applied = await migrateToLatest(url, migrationFolderFor(import.meta.url));
  process.stdout.write(
    applied.length > 0 ? `Applied migrations: ${applied.join(', ')}\n` : 'Nothing to migrate.\n',
  );
} catch (error) {
  process.stderr.write(`${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
}
