import { Migration } from '@mikro-orm/migrations';

/** Background sensor-log imports: state, progress, cancellation and result of each job. */
export class Migration20261201235511_import_jobs extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "import_job" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid not null, "rig_id" uuid not null, "source_file_id" uuid not null, "created_by_id" uuid null, "state" text check ("state" in ('queued', 'running', 'completed', 'failed', 'cancelled')) not null default 'queued', "input" jsonb not null, "bytes_done" bigint not null default 0, "bytes_total" bigint not null default 0, "rows_done" int not null default 0, "attempts" int not null default 0, "cancel_requested" boolean not null default false, "result" jsonb null, "error" text null, "started_at" timestamptz null, "finished_at" timestamptz null, constraint "import_job_pkey" primary key ("id"));`);
    this.addSql(`create index "import_job_lab_id_created_at_index" on "import_job" ("lab_id", "created_at");`);

    this.addSql(`alter table "import_job" add constraint "import_job_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "import_job" add constraint "import_job_rig_id_foreign" foreign key ("rig_id") references "rig" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "import_job" add constraint "import_job_source_file_id_foreign" foreign key ("source_file_id") references "source_file" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "import_job" add constraint "import_job_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "import_job" cascade;`);
  }

}
