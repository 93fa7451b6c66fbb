import { Migration } from '@mikro-orm/migrations';

/** Saved fits, studies, comments, review history, in-app notices and share links. */
export class Migration20261201230509_fits_studies_review extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "study" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid not null, "created_by_id" uuid null, "updated_by_id" uuid null, "title" varchar(160) not null, "blocks" jsonb not null, "revision" int not null default 1, "review_state" text check ("review_state" in ('draft', 'in-review', 'approved', 'changes-requested')) not null default 'draft', constraint "study_pkey" primary key ("id"));`);
    this.addSql(`create index "study_lab_id_updated_at_index" on "study" ("lab_id", "updated_at");`);

    this.addSql(`create table "share_link" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid not null, "study_id" uuid not null, "created_by_id" uuid null, "token_hash" varchar(64) not null, "expires_at" timestamptz not null, "revoked_at" timestamptz null, constraint "share_link_pkey" primary key ("id"));`);
    this.addSql(`alter table "share_link" add constraint "share_link_token_hash_unique" unique ("token_hash");`);

    this.addSql(`create table "review_event" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid not null, "actor_id" uuid null, "target_kind" text check ("target_kind" in ('fit', 'study')) not null, "target_id" uuid not null, "from_state" text check ("from_state" in ('draft', 'in-review', 'approved', 'changes-requested')) not null, "to_state" text check ("to_state" in ('draft', 'in-review', 'approved', 'changes-requested')) not null, "note" text not null default '', constraint "review_event_pkey" primary key ("id"));`);
    this.addSql(`create index "review_event_target_kind_target_id_created_at_index" on "review_event" ("target_kind", "target_id", "created_at");`);

    this.addSql(`create table "notice" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "user_id" uuid not null, "lab_id" uuid not null, "text" varchar(300) not null, "link" varchar(300) not null, "read_at" timestamptz null, constraint "notice_pkey" primary key ("id"));`);
    this.addSql(`create index "notice_user_id_read_at_index" on "notice" ("user_id", "read_at");`);

    this.addSql(`create table "fit" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid not null, "rig_id" uuid not null, "created_by_id" uuid null, "title" varchar(160) not null, "version" int not null default 1, "previous_id" uuid null, "model" varchar(400) not null, "trial_ids" jsonb not null, "trials_hash" varchar(64) not null, "settings" jsonb not null, "result" jsonb not null, "software_version" varchar(40) not null, "review_state" text check ("review_state" in ('draft', 'in-review', 'approved', 'changes-requested')) not null default 'draft', constraint "fit_pkey" primary key ("id"));`);
    this.addSql(`create index "fit_lab_id_created_at_index" on "fit" ("lab_id", "created_at");`);
    this.addSql(`alter table "fit" add constraint "fit_rig_id_title_version_unique" unique ("rig_id", "title", "version");`);

    this.addSql(`create table "comment" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid not null, "author_id" uuid null, "target_kind" text check ("target_kind" in ('fit', 'study')) not null, "target_id" uuid not null, "block_id" varchar(40) null, "body" text not null, constraint "comment_pkey" primary key ("id"));`);
    this.addSql(`create index "comment_target_kind_target_id_created_at_index" on "comment" ("target_kind", "target_id", "created_at");`);

    this.addSql(`alter table "study" add constraint "study_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "study" add constraint "study_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "study" add constraint "study_updated_by_id_foreign" foreign key ("updated_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "share_link" add constraint "share_link_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "share_link" add constraint "share_link_study_id_foreign" foreign key ("study_id") references "study" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "share_link" add constraint "share_link_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "review_event" add constraint "review_event_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "review_event" add constraint "review_event_actor_id_foreign" foreign key ("actor_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "notice" add constraint "notice_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "notice" add constraint "notice_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "fit" add constraint "fit_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "fit" add constraint "fit_rig_id_foreign" foreign key ("rig_id") references "rig" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "fit" add constraint "fit_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "fit" add constraint "fit_previous_id_foreign" foreign key ("previous_id") references "fit" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "comment" add constraint "comment_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "comment" add constraint "comment_author_id_foreign" foreign key ("author_id") references "app_user" ("id") on update cascade on delete set null;`);
  }

  override async down(): Promise<void> {
    this.addSql(`alter table "share_link" drop constraint "share_link_study_id_foreign";`);

    this.addSql(`alter table "fit" drop constraint "fit_previous_id_foreign";`);

    this.addSql(`drop table if exists "study" cascade;`);

    this.addSql(`drop table if exists "share_link" cascade;`);

    this.addSql(`drop table if exists "review_event" cascade;`);

    this.addSql(`drop table if exists "notice" cascade;`);

    this.addSql(`drop table if exists "fit" cascade;`);

    this.addSql(`drop table if exists "comment" cascade;`);
  }

}
