/**
 * Registers the commands that live outside main.ts's built-in table. Each line adds one
 * command; its module is imported only when the command runs.
 */
import { registerCommand } from '../main.js';

registerCommand('import', 'import --market NAME FILE.csv [--create [--area-unit sqft|m2] [--currency USD]] [--replace]', async () => (await import('./import.js')).importCommand);
registerCommand('export', 'export --market NAME [--output FILE.csv]', async () => (await import('./export.js')).exportCommand);
registerCommand('serve', 'serve [--port 3000] [--host 127.0.0.1] [--workers 1]', async () => (await import('./serve.js')).serveCommand);
registerCommand('seed', 'seed   (rebuild the demo market)', async () => (await import('./seed.js')).seedCommand);
registerCommand('worksheet', 'worksheet --estimate ID --out FILE.pdf|FILE.csv', async () => (await import('./worksheet.js')).worksheetCommand);
registerCommand('user', 'user add NAME | user password NAME | user remove NAME | user list   (password asked, or read from standard input)', async () => (await import('./user.js')).userCommand);
registerCommand('backup', 'backup FILE [--force]   (a consistent copy of the database file, safe while the app runs)', async () => (await import('./backup.js')).backupCommand);
