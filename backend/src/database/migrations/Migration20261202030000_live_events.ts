import { Migration } from '@mikro-orm/migrations';

/**
 * Live updates across server instances: every pin change and map save is a row of `map_events`, written
 * in the change's own transaction; a trigger announces it with `NOTIFY map_events, '{"id":…,"mapId":…}'`,
 * which PostgreSQL delivers only when (and if) the transaction commits, so listeners can always read the row.
 * `rate_limit_hits` holds the rate-limit counters so limits hold across instances.
 */
export class Migration20261202030000_live_events extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create table "map_events" (
      "id" bigserial primary key,
      "map_id" uuid not null,
      "kind" varchar(20) not null,
      "payload" jsonb not null,
      "actor_id" uuid null,
      "created_at" timestamptz not null
    );`);
    this.addSql(`create index "map_events_map_id_index" on "map_events" ("map_id", "id");`);
    this.addSql(`create index "map_events_created_at_index" on "map_events" ("created_at");`);
    this.addSql(`alter table "map_events" add constraint "map_events_map_id_foreign" foreign key ("map_id") references "maps" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "map_events" add constraint "map_events_actor_id_foreign" foreign key ("actor_id") references "users" ("id") on update cascade on delete set null;`);
    this.addSql(`create function "map_events_notify"() returns trigger language plpgsql as $$
      begin
        perform pg_notify('map_events', json_build_object('id', new.id::text, 'mapId', new.map_id)::text);
        return null;
      end;
    $$;`);
    this.addSql(`create trigger "map_events_notify" after insert on "map_events" for each row execute function "map_events_notify"();`);

    this.addSql(`create table "rate_limit_hits" (
      "key" varchar(200) not null,
      "hits" int not null,
      "expires_at" timestamptz not null,
      "blocked_until" timestamptz null,
      constraint "rate_limit_hits_pkey" primary key ("key")
    );`);
    this.addSql(`create index "rate_limit_hits_expires_at_index" on "rate_limit_hits" ("expires_at");`);
  }

  override async down(): Promise<void> {
    this.addSql('drop table if exists "rate_limit_hits" cascade;');
    this.addSql('drop table if exists "map_events" cascade;');
    this.addSql('drop function if exists "map_events_notify"();');
  }
}
