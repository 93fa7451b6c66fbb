import { Migration } from '@mikro-orm/migrations';

/**
 * Design comparisons: a lab's saved comparison of two or more rigs or saved fits (what to compare
 * and at which conditions; the numbers are recomputed from the trials when it is read), and
 * comments on a comparison (`comment.target_kind` 'comparison').
 */
export class Migration20261203123000_comparisons extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "comparison" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid not null, "created_by_id" uuid null, "title" varchar(160) not null, "subjects" jsonb not null, "settings" jsonb not null default '{}', constraint "comparison_pkey" primary key ("id"));`);
    this.addSql(`create index "comparison_lab_id_created_at_index" on "comparison" ("lab_id", "created_at");`);
    this.addSql(`alter table "comparison" add constraint "comparison_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "comparison" add constraint "comparison_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "comment" drop constraint if exists "comment_target_kind_check";`);
    this.addSql(`alter table "comment" add constraint "comment_target_kind_check" check("target_kind" in ('fit', 'study', 'comparison'));`);
  }

  override async down(): Promise<void> {
    this.addSql(`delete from "comment" where "target_kind" = 'comparison';`);
    this.addSql(`alter table "comment" drop constraint if exists "comment_target_kind_check";`);
    this.addSql(`alter table "comment" add constraint "comment_target_kind_check" check("target_kind" in ('fit', 'study'));`);
    this.addSql(`drop table if exists "comparison" cascade;`);
  }

}
