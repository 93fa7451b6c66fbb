import { Migration } from '@mikro-orm/migrations';

/**
 * Security: sign-ups wait for their address to be confirmed (`pending_sign_up`); API tokens expire
 * (existing tokens get 90 days from their creation); a study remembers who edited it since its last
 * review (they may not decide it); more audit kinds (shares, reviews, downloads, refused and
 * rate-limited requests).
 */
export class Migration20261203082759_security extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "pending_sign_up" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "email" varchar(254) not null, "name" varchar(120) not null, "lab_name" varchar(120) not null default '', "password_hash" varchar(255) not null, "token_hash" varchar(64) not null, "next" varchar(500) not null default '', "expires_at" timestamptz not null, "used_at" timestamptz null, constraint "pending_sign_up_pkey" primary key ("id"));`);
    this.addSql(`alter table "pending_sign_up" add constraint "pending_sign_up_token_hash_unique" unique ("token_hash");`);
    this.addSql(`create index "pending_sign_up_email_index" on "pending_sign_up" ("email");`);

    this.addSql(`alter table "audit_event" drop constraint if exists "audit_event_kind_check";`);

    this.addSql(`alter table "study" add column "edited_since_review" jsonb not null default '[]';`);

    this.addSql(`alter table "audit_event" add constraint "audit_event_kind_check" check("kind" in ('sign-in', 'sign-in-failed', 'sign-out', 'sign-out-everywhere', 'sign-up', 'password-changed', 'password-reset-requested', 'password-reset', 'invitation-sent', 'invitation-accepted', 'role-changed', 'member-removed', 'lab-created', 'token-created', 'token-revoked', 'tokens-revoked', 'sign-up-requested', 'invitation-replaced', 'share-created', 'share-revoked', 'review-submitted', 'review-approved', 'review-returned', 'file-downloaded', 'request-refused', 'rate-limited'));`);

    this.addSql(`alter table "api_token" add column "expires_at" timestamptz null;`);
    this.addSql(`update "api_token" set "expires_at" = "created_at" + interval '90 days';`);
    this.addSql(`alter table "api_token" alter column "expires_at" set not null;`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "pending_sign_up" cascade;`);

    this.addSql(`alter table "audit_event" drop constraint if exists "audit_event_kind_check";`);

    this.addSql(`alter table "api_token" drop column "expires_at";`);

    this.addSql(`alter table "audit_event" add constraint "audit_event_kind_check" check("kind" in ('sign-in', 'sign-in-failed', 'sign-out', 'sign-out-everywhere', 'sign-up', 'password-changed', 'password-reset-requested', 'password-reset', 'invitation-sent', 'invitation-accepted', 'role-changed', 'member-removed', 'lab-created', 'token-created', 'token-revoked'));`);

    this.addSql(`alter table "study" drop column "edited_since_review";`);
  }

}
