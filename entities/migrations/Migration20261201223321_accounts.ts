import { Migration } from '@mikro-orm/migrations';

/** Sessions, invitations, password resets, API tokens, the audit log and rate limits. */
export class Migration20261201223321_accounts extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "rate_limit" ("key" varchar(300) not null, "count" int not null, "reset_at" timestamptz not null, constraint "rate_limit_pkey" primary key ("key"));`);

    this.addSql(`create table "session" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "user_id" uuid not null, "expires_at" timestamptz not null, "revoked_at" timestamptz null, "last_seen_at" timestamptz not null, "user_agent" varchar(300) not null default '', constraint "session_pkey" primary key ("id"));`);

    this.addSql(`create table "password_reset" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "user_id" uuid not null, "token_hash" varchar(64) not null, "expires_at" timestamptz not null, "used_at" timestamptz null, constraint "password_reset_pkey" primary key ("id"));`);
    this.addSql(`alter table "password_reset" add constraint "password_reset_token_hash_unique" unique ("token_hash");`);

    this.addSql(`create table "invitation" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid not null, "email" varchar(254) not null, "role" text check ("role" in ('owner', 'engineer', 'reviewer', 'viewer')) not null, "token_hash" varchar(64) not null, "expires_at" timestamptz not null, "accepted_at" timestamptz null, "revoked_at" timestamptz null, "invited_by_id" uuid null, constraint "invitation_pkey" primary key ("id"));`);
    this.addSql(`alter table "invitation" add constraint "invitation_token_hash_unique" unique ("token_hash");`);

    this.addSql(`create table "audit_event" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid null, "actor_id" uuid null, "kind" text check ("kind" in ('sign-in', 'sign-in-failed', 'sign-out', 'sign-out-everywhere', 'sign-up', 'password-changed', 'password-reset-requested', 'password-reset', 'invitation-sent', 'invitation-accepted', 'role-changed', 'member-removed', 'lab-created', 'token-created', 'token-revoked')) not null, "subject" varchar(300) not null default '', "ip" varchar(64) not null default '', constraint "audit_event_pkey" primary key ("id"));`);
    this.addSql(`create index "audit_event_lab_id_created_at_index" on "audit_event" ("lab_id", "created_at");`);

    this.addSql(`create table "api_token" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "user_id" uuid not null, "lab_id" uuid not null, "name" varchar(80) not null, "prefix" varchar(16) not null, "token_hash" varchar(64) not null, "last_used_at" timestamptz null, "revoked_at" timestamptz null, constraint "api_token_pkey" primary key ("id"));`);
    this.addSql(`alter table "api_token" add constraint "api_token_token_hash_unique" unique ("token_hash");`);

    this.addSql(`alter table "session" add constraint "session_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "password_reset" add constraint "password_reset_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "invitation" add constraint "invitation_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "invitation" add constraint "invitation_invited_by_id_foreign" foreign key ("invited_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "audit_event" add constraint "audit_event_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "audit_event" add constraint "audit_event_actor_id_foreign" foreign key ("actor_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "api_token" add constraint "api_token_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "api_token" add constraint "api_token_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "rate_limit" cascade;`);

    this.addSql(`drop table if exists "session" cascade;`);

    this.addSql(`drop table if exists "password_reset" cascade;`);

    this.addSql(`drop table if exists "invitation" cascade;`);

    this.addSql(`drop table if exists "audit_event" cascade;`);

    this.addSql(`drop table if exists "api_token" cascade;`);
  }

}
