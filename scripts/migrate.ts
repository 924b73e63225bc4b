// `npm run migrate`: bring the database at DATABASE_URL (default: DATA_DIR's SQLite file) up to date.
import { closeDb, getDb } from '../src/lib/server/db/index';
import { migrate } from '../src/lib/server/db/migrate';

const applied = await migrate(getDb());
console.log(applied.length ? `Applied ${applied.join(', ')}` : 'Database is up to date.');
await closeDb();
