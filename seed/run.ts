/**
 * `npm run seed`: rebuilds the demo market in the database named by DATABASE_URL (default
 * file:data/compfit.db), creating and migrating the database if needed.
 */
import { openConfiguredDatabase, readConfig } from '../src/server.js';
import { closeDatabase } from '../src/store/database.js';
import { installDemoMarket } from '../src/store/demo-market.js';

const db = await openConfiguredDatabase(readConfig(process.env));
try {
  const { count } = await installDemoMarket(db);
  console.log(`compfit: rebuilt the demo market with ${count} sales`);
} finally {
  closeDatabase(db);
}
