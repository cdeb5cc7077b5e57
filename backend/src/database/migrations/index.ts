import type { MigrationObject } from '@mikro-orm/core';
import { Migration20261202010000_accounts } from './Migration20261202010000_accounts';
import { Migration20261202020000_species } from './Migration20261202020000_species';
import { Migration20261202020100_maps } from './Migration20261202020100_maps';
import { Migration20261202020200_pins } from './Migration20261202020200_pins';
import { Migration20261202020300_viewing_links } from './Migration20261202020300_viewing_links';
import { Migration20261202030000_live_events } from './Migration20261202030000_live_events';
import { Migration20261202040000_invitation_mail } from './Migration20261202040000_invitation_mail';

// Migrations in the order they apply. Listing them explicitly lets the compiled server,
// the CLI and Vitest run exactly the same committed migrations.
export const ALL_MIGRATIONS: MigrationObject[] = [
  { name: 'Migration20261202010000_accounts', class: Migration20261202010000_accounts },
  { name: 'Migration20261202020000_species', class: Migration20261202020000_species },
  { name: 'Migration20261202020100_maps', class: Migration20261202020100_maps },
  { name: 'Migration20261202020200_pins', class: Migration20261202020200_pins },
  { name: 'Migration20261202020300_viewing_links', class: Migration20261202020300_viewing_links },
  { name: 'Migration20261202030000_live_events', class: Migration20261202030000_live_events },
  { name: 'Migration20261202040000_invitation_mail', class: Migration20261202040000_invitation_mail },
];
