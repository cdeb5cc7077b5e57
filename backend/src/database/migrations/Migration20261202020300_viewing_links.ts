import { Migration } from '@mikro-orm/migrations';

/** Read-only viewing links: the token only as its SHA-256, with expiry, revocation and a view count. */
export class Migration20261202020300_viewing_links extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create table "viewing_links" (
      "id" uuid not null,
      "map_id" uuid not null,
      "token_hash" varchar(64) not null,
      "created_by_id" uuid null,
      "created_at" timestamptz not null,
      "expires_at" timestamptz null,
      "include_pins" boolean not null default false,
      "view_count" int not null default 0,
      "last_viewed_at" timestamptz null,
      "revoked_at" timestamptz null,
      "revoked_by_id" uuid null,
      constraint "viewing_links_pkey" primary key ("id")
    );`);
    this.addSql(`alter table "viewing_links" add constraint "viewing_links_token_hash_unique" unique ("token_hash");`);
    this.addSql(`create index "viewing_links_map_index" on "viewing_links" ("map_id");`);

    this.addSql(`alter table "viewing_links" add constraint "viewing_links_map_id_foreign" foreign key ("map_id") references "maps" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "viewing_links" add constraint "viewing_links_created_by_id_foreign" foreign key ("created_by_id") references "users" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "viewing_links" add constraint "viewing_links_revoked_by_id_foreign" foreign key ("revoked_by_id") references "users" ("id") on update cascade on delete set null;`);
  }

  override async down(): Promise<void> {
    this.addSql('drop table if exists "viewing_links" cascade;');
  }
}
