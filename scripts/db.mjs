// Database tasks: `npm run db:up | db:down | db:migrate | db:seed | db:backup [FILE] | db:restore -- FILE [--force]`
// (the demo database unless FIELDBOUND_DB_NAME says otherwise). Backup and restore: scripts/lib/backup.mjs, docs/operations.md.
import path from 'node:path';
import { repoRoot } from './lib/paths.mjs';
import { failAndExit, BootstrapError } from './lib/log.mjs';
import { runOrThrow } from './lib/run.mjs';
import { LocalCluster } from './lib/postgres.mjs';
import { backup, restore } from './lib/backup.mjs';

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
    case 'backup': {
      const [file, ...extra] = process.argv.slice(3);
      if (extra.length || file?.startsWith('-')) throw new BootstrapError('usage: node scripts/db.mjs backup [FILE]');
      await cluster.start();
      backup(cluster, database, file);
      return;
    }
    case 'restore': {
      const args = process.argv.slice(3);
      const force = args.includes('--force');
      const files = args.filter((a) => a !== '--force');
      if (files.length !== 1 || files[0].startsWith('-')) throw new BootstrapError('usage: node scripts/db.mjs restore FILE [--force]   (npm run db:restore -- FILE [--force])');
      await cluster.start();
      restore(cluster, database, files[0], { force });
      return;
    }
    default:
      throw new BootstrapError('usage: node scripts/db.mjs up|down|migrate|seed|backup [FILE]|restore FILE [--force]');
  }
}

main(process.argv[2]).catch(failAndExit);
