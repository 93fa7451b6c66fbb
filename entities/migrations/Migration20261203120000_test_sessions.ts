import { Migration } from '@mikro-orm/migrations';

/**
 * Test sessions at a rig (`test_session`): the plan, the runs as they go, the logger's samples as a
 * sensor log (a `source_file` of the rig, its samples in `sensor_sample`) and the closing verdict.
 * Trials point back to the session they were read or cut in (`trial.session_id`, indexed: the
 * session page and its closing read a session's trials).
 */
export class Migration20261203120000_test_sessions extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "test_session" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid not null, "rig_id" uuid not null, "created_by_id" uuid null, "title" varchar(160) not null, "state" text check ("state" in ('planned', 'running', 'closed')) not null default 'planned', "settings" jsonb not null, "plan" jsonb not null, "runs" jsonb not null, "source_file_id" uuid null, "first_sample_at" timestamptz null, "last_sample_at" timestamptz null, "sample_count" int not null default 0, "recorded_until_s" double precision null, "closed_at" timestamptz null, "closing" jsonb null, "study_id" uuid null, constraint "test_session_pkey" primary key ("id"));`);
    this.addSql(`create index "test_session_rig_id_created_at_index" on "test_session" ("rig_id", "created_at");`);
    this.addSql(`alter table "test_session" add constraint "test_session_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "test_session" add constraint "test_session_rig_id_foreign" foreign key ("rig_id") references "rig" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "test_session" add constraint "test_session_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "test_session" add constraint "test_session_source_file_id_foreign" foreign key ("source_file_id") references "source_file" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "test_session" add constraint "test_session_study_id_foreign" foreign key ("study_id") references "study" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "trial" add column "session_id" uuid null;`);
    this.addSql(`alter table "trial" add constraint "trial_session_id_foreign" foreign key ("session_id") references "test_session" ("id") on update cascade on delete set null;`);
    this.addSql(`create index "trial_session_id_index" on "trial" ("session_id");`);
  }

  override async down(): Promise<void> {
    this.addSql(`alter table "trial" drop constraint "trial_session_id_foreign";`);
    this.addSql(`drop index "trial_session_id_index";`);
    this.addSql(`alter table "trial" drop column "session_id";`);
    this.addSql(`drop table if exists "test_session" cascade;`);
  }

}
