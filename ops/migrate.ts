import { loadConfig } from '../backend/src/config';
import { createDb } from '../backend/src/db';

/** `npm run migrate` (latest) or `npm run migrate -- down` (undo the last batch), against the configured database. */
const config = loadConfig();
const db = createDb(config.databaseUrl, { max: 1 });
try {
  if (process.argv[2] === 'down') {
    const [, undone] = (await db.migrate.rollback()) as [number, string[]];
    console.log(undone.length ? `Rolled back: ${undone.join(', ')}` : 'Nothing to roll back.');
  } else {
    const [, applied] = (await db.migrate.latest()) as [number, string[]];
    console.log(applied.length ? `Applied: ${applied.join(', ')}` : 'Already up to date.');
  }
} finally {
  await db.destroy();
}
