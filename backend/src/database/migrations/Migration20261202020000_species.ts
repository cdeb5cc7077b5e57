import { Migration } from '@mikro-orm/migrations';
import { BUILTIN_SPECIES } from '../../species/data/builtin-species';

/**
 * The species catalogue (45 neutral atoms, seeded here with each number's published source) and
 * team species lists imported from CSV.
 */
export class Migration20261202020000_species extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create table "catalogue_species" (
      "symbol" varchar(3) not null,
      "atomic_number" int not null,
      "name" varchar(40) not null,
      "polarizability_a0" double precision not null,
      "polarizability_uncertainty_a0" double precision null,
      "polarizability_source" text not null,
      "polarizability_status" varchar(20) not null,
      "electron_affinity_ev" double precision null,
      "electron_affinity_uncertainty_ev" double precision null,
      "electron_affinity_source" text not null,
      "electron_affinity_status" varchar(20) not null,
      "electron_affinity_note" text null,
      "mass_number" int not null,
      "mass_source" text not null,
      constraint "catalogue_species_pkey" primary key ("symbol")
    );`);
    this.addSql(`alter table "catalogue_species" add constraint "catalogue_species_atomic_number_unique" unique ("atomic_number");`);
    this.addSql(
      this.getKnex()
        .insert(
          BUILTIN_SPECIES.map((s) => ({
            symbol: s.symbol,
            atomic_number: s.atomicNumber,
            name: s.name,
            polarizability_a0: s.polarizabilityA0,
            polarizability_uncertainty_a0: s.polarizabilityUncertaintyA0,
            polarizability_source: s.polarizabilitySource,
            polarizability_status: s.polarizabilityStatus,
            electron_affinity_ev: s.electronAffinityEv,
            electron_affinity_uncertainty_ev: s.electronAffinityUncertaintyEv,
            electron_affinity_source: s.electronAffinitySource,
            electron_affinity_status: s.electronAffinityStatus,
            electron_affinity_note: s.electronAffinityNote,
            mass_number: s.massNumber,
            mass_source: s.massSource,
          })),
        )
        .into('catalogue_species'),
    );

    this.addSql(`create table "species_lists" (
      "id" uuid not null,
      "team_id" uuid not null,
      "name" varchar(100) not null,
      "file_name" varchar(255) null,
      "created_by_id" uuid null,
      "created_at" timestamptz not null,
      constraint "species_lists_pkey" primary key ("id")
    );`);
    this.addSql(`create index "species_lists_team_index" on "species_lists" ("team_id");`);
    this.addSql(`alter table "species_lists" add constraint "species_lists_team_name_unique" unique ("team_id", "name");`);

    this.addSql(`create table "team_species" (
      "id" uuid not null,
      "list_id" uuid not null,
      "line" int not null,
      "name" varchar(80) not null,
      "polarizability_a0" double precision not null,
      "polarizability_uncertainty_a0" double precision null,
      "entered_value" double precision not null,
      "entered_uncertainty" double precision null,
      "entered_unit" text check ("entered_unit" in ('a0^3', 'A^3', '1e-24cm^3')) not null,
      "mass_number" int not null,
      "electron_affinity_ev" double precision null,
      "source" text not null,
      constraint "team_species_pkey" primary key ("id")
    );`);
    this.addSql(`create unique index "team_species_list_name_unique" on "team_species" ("list_id", lower("name"));`);

    this.addSql(`alter table "species_lists" add constraint "species_lists_team_id_foreign" foreign key ("team_id") references "teams" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "species_lists" add constraint "species_lists_created_by_id_foreign" foreign key ("created_by_id") references "users" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "team_species" add constraint "team_species_list_id_foreign" foreign key ("list_id") references "species_lists" ("id") on update cascade on delete cascade;`);
  }

  override async down(): Promise<void> {
    this.addSql('drop table if exists "team_species" cascade;');
    this.addSql('drop table if exists "species_lists" cascade;');
    this.addSql('drop table if exists "catalogue_species" cascade;');
  }
}
