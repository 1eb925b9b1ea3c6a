/** `compfit seed`: rebuilds the demo market (seed/README.md) in the configured database. */
import { closeDatabase } from '../../store/database.js';
import { installDemoMarket } from '../../store/demo-market.js';
import { InputError, type Command } from '../cli-io.js';
import { openCliDatabase } from './store-access.js';

export const seedCommand: Command = async (args, io) => {
  if (args.length > 0) throw new InputError([`unexpected argument "${args[0]}"`]);
  const db = await openCliDatabase(io);
  try {
    const { count } = await installDemoMarket(db);
    io.stdout(`rebuilt the demo market with ${count} sales\n`);
    return 0;
  } finally {
    closeDatabase(db);
  }
};
