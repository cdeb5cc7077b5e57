import type { MigrationObject } from '@mikro-orm/core';

// Migrations in the order they apply. Listing them explicitly lets the compiled server,
// the CLI and Vitest run exactly the same committed migrations.
export const ALL_MIGRATIONS: MigrationObject[] = [];
