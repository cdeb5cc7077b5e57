// Database tasks run by the project's scripts: `node backend/dist/database/db-cli.js migrate|seed`.
import 'reflect-metadata';
import { loadConfig } from '../config/configuration';
import { migrateUp } from './migrate';
import { seedDemoData } from './seed';

async function main(command: string | undefined): Promise<void> {
  const config = loadConfig();
  switch (command) {
    case 'migrate': {
      const applied = await migrateUp(config.database);
      console.log(`[fieldbound] ${config.database.name}: ${applied.length ? `applied ${applied.join(', ')}` : 'schema up to date'}`);
      return;
    }
    case 'seed': {
      const report = await seedDemoData(config.database, { reset: process.argv.includes('--reset') });
      console.log(`[fieldbound] ${config.database.name}: ${report}`);
      return;
    }
    default:
      console.error('usage: db-cli migrate | seed [--reset]');
      process.exit(2);
  }
}

main(process.argv[2]).catch((error: unknown) => {
  console.error(`[fieldbound] error: ${(error as Error).message}`);
  process.exit(1);
});
