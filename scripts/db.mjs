// Database tasks: `npm run db:up | db:down | db:migrate | db:seed` (the demo database unless FIELDBOUND_DB_NAME says otherwise).
import path from 'node:path';
import { repoRoot } from './lib/paths.mjs';
import { failAndExit, BootstrapError } from './lib/log.mjs';
import { runOrThrow } from './lib/run.mjs';
import { LocalCluster } from './lib/postgres.mjs';

const database = process.env.FIELDBOUND_DB_NAME ?? 'fieldbound';

async function main(command) {
  const cluster = new LocalCluster();
  switch (command) {
    case 'up':
      await cluster.start();
      cluster.ensureDatabase(database);
      console.log(`postgresql://fieldbound@127.0.0.1:${cluster.port}/${database} (password in .data/db-password)`);
      return;
    case 'down':
      cluster.stop();
      return;
    case 'migrate':
    case 'seed': {
      await cluster.start();
      cluster.ensureDatabase(database);
      const cli = path.join(repoRoot, 'backend', 'dist', 'database', 'db-cli.js');
      runOrThrow(process.execPath, [cli, command, ...process.argv.slice(3)], { env: { ...process.env, ...cluster.envFor(database) } });
      return;
    }
    default:
      throw new BootstrapError('usage: node scripts/db.mjs up|down|migrate|seed');
  }
}

main(process.argv[2]).catch(failAndExit);
