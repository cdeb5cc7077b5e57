import { Migration } from '@mikro-orm/migrations';

/**
 * Accounts, sessions, research teams with roles, e-mail invitations and the audit log.
 * Secrets are never stored: passwords as argon2id hashes, tokens as SHA-256 of their secret part.
 */
export class Migration20261202010000_accounts extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create table "users" (
      "id" uuid not null,
      "email" varchar(254) not null,
      "display_name" varchar(100) not null,
      "password_hash" varchar(255) not null,
      "token_version" int not null,
      "last_sign_in_at" timestamptz null,
      "created_at" timestamptz not null,
      "updated_at" timestamptz not null,
      constraint "users_pkey" primary key ("id")
    );`);
    this.addSql(`alter table "users" add constraint "users_email_unique" unique ("email");`);

    this.addSql(`create table "refresh_tokens" (
      "id" uuid not null,
      "user_id" uuid not null,
      "family_id" uuid not null,
      "token_hash" varchar(64) not null,
      "created_at" timestamptz not null,
      "expires_at" timestamptz not null,
      "used_at" timestamptz null,
      "revoked_at" timestamptz null,
      "user_agent" varchar(300) null,
      constraint "refresh_tokens_pkey" primary key ("id")
    );`);
    this.addSql(`create index "refresh_tokens_user_index" on "refresh_tokens" ("user_id");`);
    this.addSql(`create index "refresh_tokens_family_index" on "refresh_tokens" ("family_id");`);
    this.addSql(`alter table "refresh_tokens" add constraint "refresh_tokens_user_id_foreign" foreign key ("user_id") references "users" ("id") on update cascade on delete cascade;`);

    this.addSql(`create table "password_reset_tokens" (
      "id" uuid not null,
      "user_id" uuid not null,
      "token_hash" varchar(64) not null,
      "created_at" timestamptz not null,
      "expires_at" timestamptz not null,
      "used_at" timestamptz null,
      constraint "password_reset_tokens_pkey" primary key ("id")
    );`);
    this.addSql(`create index "password_reset_tokens_user_index" on "password_reset_tokens" ("user_id");`);
    this.addSql(`alter table "password_reset_tokens" add constraint "password_reset_tokens_user_id_foreign" foreign key ("user_id") references "users" ("id") on update cascade on delete cascade;`);

    this.addSql(`create table "teams" (
      "id" uuid not null,
      "name" varchar(100) not null,
      "created_at" timestamptz not null,
      constraint "teams_pkey" primary key ("id")
    );`);

    this.addSql(`create table "memberships" (
      "id" uuid not null,
      "team_id" uuid not null,
      "user_id" uuid not null,
      "role" text check ("role" in ('viewer', 'editor', 'owner')) not null,
      "created_at" timestamptz not null,
      constraint "memberships_pkey" primary key ("id")
    );`);
    this.addSql(`create index "memberships_user_index" on "memberships" ("user_id");`);
    this.addSql(`alter table "memberships" add constraint "memberships_team_user_unique" unique ("team_id", "user_id");`);
    this.addSql(`alter table "memberships" add constraint "memberships_team_id_foreign" foreign key ("team_id") references "teams" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "memberships" add constraint "memberships_user_id_foreign" foreign key ("user_id") references "users" ("id") on update cascade on delete cascade;`);

    this.addSql(`create table "invitations" (
      "id" uuid not null,
      "team_id" uuid not null,
      "email" varchar(254) not null,
      "role" text check ("role" in ('viewer', 'editor', 'owner')) not null,
      "invited_by_id" uuid null,
      "token_hash" varchar(64) not null,
      "created_at" timestamptz not null,
      "last_sent_at" timestamptz not null,
      "send_count" int not null,
      "expires_at" timestamptz not null,
      "accepted_at" timestamptz null,
      "accepted_by_id" uuid null,
      "revoked_at" timestamptz null,
      constraint "invitations_pkey" primary key ("id")
    );`);
    this.addSql(`create index "invitations_team_index" on "invitations" ("team_id");`);
    this.addSql(`alter table "invitations" add constraint "invitations_team_id_foreign" foreign key ("team_id") references "teams" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "invitations" add constraint "invitations_invited_by_id_foreign" foreign key ("invited_by_id") references "users" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "invitations" add constraint "invitations_accepted_by_id_foreign" foreign key ("accepted_by_id") references "users" ("id") on update cascade on delete set null;`);

    this.addSql(`create table "audit_events" (
      "id" uuid not null,
      "action" varchar(60) not null,
      "team_id" uuid null,
      "actor_id" uuid null,
      "actor_email" varchar(254) null,
      "target_user_id" uuid null,
      "target_email" varchar(254) null,
      "details" jsonb null,
      "ip" varchar(64) null,
      "created_at" timestamptz not null,
      constraint "audit_events_pkey" primary key ("id")
    );`);
    this.addSql(`create index "audit_events_team_created_index" on "audit_events" ("team_id", "created_at");`);
    this.addSql(`create index "audit_events_actor_created_index" on "audit_events" ("actor_id", "created_at");`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "audit_events" cascade;`);
    this.addSql(`drop table if exists "invitations" cascade;`);
    this.addSql(`drop table if exists "memberships" cascade;`);
    this.addSql(`drop table if exists "teams" cascade;`);
    this.addSql(`drop table if exists "password_reset_tokens" cascade;`);
    this.addSql(`drop table if exists "refresh_tokens" cascade;`);
    this.addSql(`drop table if exists "users" cascade;`);
  }
}
