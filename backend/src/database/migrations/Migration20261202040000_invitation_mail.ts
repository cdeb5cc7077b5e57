import { Migration } from '@mikro-orm/migrations';

/**
 * Invitation e-mail delivery state, kept in the database so a mail server outage loses nothing: an invitation
 * whose e-mail could not be sent is `pending` and re-sent with backoff by whichever server instance claims it
 * first (`invitations_mail_due_index` serves that scan).
 */
export class Migration20261202040000_invitation_mail extends Migration {
  override async up(): Promise<void> {
    this.addSql(`alter table "invitations"
      add column "mail_status" text check ("mail_status" in ('sent', 'pending')) not null default 'sent',
      add column "mail_attempts" int not null default 0,
      add column "mail_next_attempt_at" timestamptz null,
      add column "mail_last_error" varchar(500) null;`);
    this.addSql(`create index "invitations_mail_due_index" on "invitations" ("mail_next_attempt_at") where "mail_status" = 'pending';`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop index if exists "invitations_mail_due_index";`);
    this.addSql(`alter table "invitations" drop constraint if exists "invitations_mail_status_check";`);
    this.addSql(`alter table "invitations" drop column "mail_status", drop column "mail_attempts", drop column "mail_next_attempt_at", drop column "mail_last_error";`);
  }
}
