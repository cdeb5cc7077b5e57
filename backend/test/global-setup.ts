import { loadConfig } from '../src/config/configuration';
import { resetSchema } from '../src/database/migrate';

// Every run applies the real committed migrations to a fresh schema of the test database.
export default async function setup(): Promise<void> {
  process.env.FIELDBOUND_DB_NAME ??= 'fieldbound_test';
  const config = loadConfig();
  if (!config.database.name.endsWith('_test')) {
    throw new Error(`backend tests refuse to run against "${config.database.name}": the database name must end in _test`);
  }
  await resetSchema(config.database);
}
