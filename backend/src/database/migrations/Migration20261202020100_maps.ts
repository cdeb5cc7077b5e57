import { Migration } from '@mikro-orm/migrations';

/** Saved maps with numbered versions, result summaries and thumbnails (the PNG bytes live in their own table so lists never load them). */
export class Migration20261202020100_maps extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create table "maps" (
      "id" uuid not null,
      "team_id" uuid not null,
      "title" varchar(200) not null,
      "description" text not null default '',
      "tags" text[] not null,
      "setup" jsonb not null,
      "version" int not null default 1,
      "created_by_id" uuid null,
      "created_at" timestamptz not null,
      "updated_by_id" uuid null,
      "updated_at" timestamptz not null,
      "deleted_at" timestamptz null,
      "deleted_by_id" uuid null,
      constraint "maps_pkey" primary key ("id")
    );`);
    this.addSql(`create index "maps_tags_index" on "maps" using gin ("tags");`);
    this.addSql(`create index "maps_team_index" on "maps" ("team_id", "deleted_at");`);

    this.addSql(`create table "map_versions" (
      "id" uuid not null,
      "map_id" uuid not null,
      "number" int not null,
      "title" varchar(200) not null,
      "description" text not null,
      "tags" text[] not null,
      "setup" jsonb not null,
      "created_by_id" uuid null,
      "created_at" timestamptz not null,
      "restored_from" int null,
      "duplicated_from_map_id" uuid null,
      "duplicated_from_version" int null,
      constraint "map_versions_pkey" primary key ("id")
    );`);
    this.addSql(`alter table "map_versions" add constraint "map_versions_map_number_unique" unique ("map_id", "number");`);

    this.addSql(`create table "map_result_summaries" (
      "map_id" uuid not null,
      "engine_version" varchar(40) not null,
      "setup_fingerprint" varchar(64) not null,
      "counts" jsonb not null,
      "computation_ms" double precision not null,
      "computed_at" timestamptz not null,
      "computed_by_id" uuid null,
      constraint "map_result_summaries_pkey" primary key ("map_id")
    );`);

    this.addSql(`create table "map_thumbnails" (
      "map_id" uuid not null,
      "png" bytea not null,
      "byte_size" int not null,
      "updated_at" timestamptz not null,
      constraint "map_thumbnails_pkey" primary key ("map_id")
    );`);

    this.addSql(`alter table "maps" add constraint "maps_team_id_foreign" foreign key ("team_id") references "teams" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "maps" add constraint "maps_created_by_id_foreign" foreign key ("created_by_id") references "users" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "maps" add constraint "maps_updated_by_id_foreign" foreign key ("updated_by_id") references "users" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "maps" add constraint "maps_deleted_by_id_foreign" foreign key ("deleted_by_id") references "users" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "map_versions" add constraint "map_versions_map_id_foreign" foreign key ("map_id") references "maps" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "map_versions" add constraint "map_versions_created_by_id_foreign" foreign key ("created_by_id") references "users" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "map_result_summaries" add constraint "map_result_summaries_map_id_foreign" foreign key ("map_id") references "maps" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "map_result_summaries" add constraint "map_result_summaries_computed_by_id_foreign" foreign key ("computed_by_id") references "users" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "map_thumbnails" add constraint "map_thumbnails_map_id_foreign" foreign key ("map_id") references "maps" ("id") on update cascade on delete cascade;`);
  }

  override async down(): Promise<void> {
    this.addSql('drop table if exists "map_thumbnails" cascade;');
    this.addSql('drop table if exists "map_result_summaries" cascade;');
    this.addSql('drop table if exists "map_versions" cascade;');
    this.addSql('drop table if exists "maps" cascade;');
  }
}
