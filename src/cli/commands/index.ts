/**
 * Registers the commands that live outside main.ts's built-in table. Each line adds one
 * command; its module is imported only when the command runs.
 */
import { registerCommand } from '../main.js';

void registerCommand;
