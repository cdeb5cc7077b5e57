import { Migration } from '@mikro-orm/migrations';

/** Pins on maps (geometry in physical units, optimistic-lock version) and their reply threads. */
export class Migration20261202020200_pins extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create table "pins" (
      "id" uuid not null,
      "map_id" uuid not null,
      "author_id" uuid null,
      "geometry" jsonb not null,
      "title" varchar(200) not null,
      "body" text not null default '',
      "status" text check ("status" in ('open', 'resolved')) not null default 'open',
      "category" varchar(40) null,
      "version" int not null default 1,
      "created_at" timestamptz not null,
      "updated_at" timestamptz not null,
      "updated_by_id" uuid null,
      "resolved_at" timestamptz null,
      "resolved_by_id" uuid null,
      constraint "pins_pkey" primary key ("id")
    );`);
    this.addSql(`create index "pins_map_index" on "pins" ("map_id");`);

    this.addSql(`create table "pin_replies" (
      "id" uuid not null,
      "pin_id" uuid not null,
      "author_id" uuid null,
      "body" text not null,
      "created_at" timestamptz not null,
      constraint "pin_replies_pkey" primary key ("id")
    );`);
    this.addSql(`create index "pin_replies_pin_index" on "pin_replies" ("pin_id", "created_at");`);

    this.addSql(`alter table "pins" add constraint "pins_map_id_foreign" foreign key ("map_id") references "maps" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "pins" add constraint "pins_author_id_foreign" foreign key ("author_id") references "users" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "pins" add constraint "pins_updated_by_id_foreign" foreign key ("updated_by_id") references "users" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "pins" add constraint "pins_resolved_by_id_foreign" foreign key ("resolved_by_id") references "users" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "pin_replies" add constraint "pin_replies_pin_id_foreign" foreign key ("pin_id") references "pins" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "pin_replies" add constraint "pin_replies_author_id_foreign" foreign key ("author_id") references "users" ("id") on update cascade on delete set null;`);
  }

  override async down(): Promise<void> {
    this.addSql('drop table if exists "pin_replies" cascade;');
    this.addSql('drop table if exists "pins" cascade;');
  }
}
