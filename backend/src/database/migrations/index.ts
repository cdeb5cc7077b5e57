import type { MigrationObject } from '@mikro-orm/core';
import { Migration20261202010000_accounts } from './Migration20261202010000_accounts';

// Migrations in the order they apply. Listing them explicitly lets the compiled server,
// the CLI and Vitest run exactly the same committed migrations.
export const ALL_MIGRATIONS: MigrationObject[] = [
  { name: 'Migration20261202010000_accounts', class: Migration20261202010000_accounts },
];
