import path from 'node:path';
import { defineConfig, type Options } from '@mikro-orm/postgresql';
import { Migrator } from '@mikro-orm/migrations';
import { loadConfig, type AppConfig } from '../config/configuration';
import { ALL_ENTITIES } from './entities';
import { ALL_MIGRATIONS } from './migrations';

/** ORM options for one database; the schema only ever changes through the committed migrations. */
export function ormOptions(db: AppConfig["database"]): Options {
  return defineConfig({
    host: db.host,
    port: db.port,
    user: db.user,
    password: db.password,
    dbName: db.name,
    entities: [...ALL_ENTITIES],
    discovery: { warnWhenNoEntities: false },
    // The project's scripts create databases; the server must still start (and answer 503) when the database is away.
    ensureDatabase: false,
    extensions: [Migrator],
    migrations: {
      migrationsList: ALL_MIGRATIONS,
      path: path.join(__dirname, 'migrations'),
      pathTs: path.join(__dirname, '..', '..', 'src', 'database', 'migrations'),
      // Migrations are written by hand (explicit SQL up and down), so no schema snapshot is kept.
      snapshot: false,
      transactional: true,
      allOrNothing: true,
      emit: 'ts',
    },
    pool: { min: 0, max: 10 },
    // Requests should fail fast with 503 when the database is away, not hang.
    driverOptions: { connection: { connectionTimeoutMillis: 3000 } },
    debug: false,
  });
}

// Default export for the MikroORM CLI (migration:create).
export default ormOptions(loadConfig().database);
