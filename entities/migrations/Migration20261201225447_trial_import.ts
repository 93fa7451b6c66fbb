import { Migration } from '@mikro-orm/migrations';

/** Source files, saved column mappings, trial history and sensor samples; trials link to their source. */
export class Migration20261201225447_trial_import extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "column_mapping" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid not null, "header_signature" varchar(64) not null, "headers" jsonb not null, "mapping" jsonb not null, constraint "column_mapping_pkey" primary key ("id"));`);
    this.addSql(`alter table "column_mapping" add constraint "column_mapping_lab_id_header_signature_unique" unique ("lab_id", "header_signature");`);

    this.addSql(`create table "source_file" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid not null, "rig_id" uuid null, "uploaded_by_id" uuid null, "purpose" text check ("purpose" in ('trials', 'photo')) not null default 'trials', "filename" varchar(255) not null, "content_type" varchar(120) not null default 'application/octet-stream', "size_bytes" bigint not null, "sha256" varchar(64) not null, "storage_key" varchar(300) not null, "state" text check ("state" in ('uploaded', 'imported', 'failed')) not null default 'uploaded', "rows_imported" int not null default 0, constraint "source_file_pkey" primary key ("id"));`);
    this.addSql(`alter table "source_file" add constraint "source_file_lab_id_sha256_purpose_unique" unique ("lab_id", "sha256", "purpose");`);

    this.addSql(`create table "trial_change" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "trial_id" uuid not null, "user_id" uuid null, "field" varchar(40) not null, "before" jsonb null, "after" jsonb null, constraint "trial_change_pkey" primary key ("id"));`);
    this.addSql(`create index "trial_change_trial_id_created_at_index" on "trial_change" ("trial_id", "created_at");`);

    this.addSql(`create table "sensor_sample" ("source_file_id" uuid not null, "line" int not null, "rig_id" uuid not null, "taken_at" timestamptz not null, "inlet_c" double precision null, "outlet_c" double precision null, "flow_m3_per_s" double precision null, "ambient_c" double precision null, constraint "sensor_sample_pkey" primary key ("source_file_id", "line"));`);
    this.addSql(`create index "sensor_sample_rig_id_taken_at_index" on "sensor_sample" ("rig_id", "taken_at");`);

    this.addSql(`alter table "column_mapping" add constraint "column_mapping_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "source_file" add constraint "source_file_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "source_file" add constraint "source_file_rig_id_foreign" foreign key ("rig_id") references "rig" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "source_file" add constraint "source_file_uploaded_by_id_foreign" foreign key ("uploaded_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "trial_change" add constraint "trial_change_trial_id_foreign" foreign key ("trial_id") references "trial" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "trial_change" add constraint "trial_change_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "sensor_sample" add constraint "sensor_sample_source_file_id_foreign" foreign key ("source_file_id") references "source_file" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "sensor_sample" add constraint "sensor_sample_rig_id_foreign" foreign key ("rig_id") references "rig" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "trial" add column "origin" text check ("origin" in ('sheet', 'log-segment', 'manual', 'api', 'demo')) not null default 'manual', add column "source_file_id" uuid null, add column "source_line" int null, add column "segment" jsonb null;`);
    this.addSql(`alter table "trial" add constraint "trial_source_file_id_foreign" foreign key ("source_file_id") references "source_file" ("id") on update cascade on delete set null;`);
  }

  override async down(): Promise<void> {
    this.addSql(`alter table "trial" drop constraint "trial_source_file_id_foreign";`);

    this.addSql(`alter table "sensor_sample" drop constraint "sensor_sample_source_file_id_foreign";`);

    this.addSql(`drop table if exists "column_mapping" cascade;`);

    this.addSql(`drop table if exists "source_file" cascade;`);

    this.addSql(`drop table if exists "trial_change" cascade;`);

    this.addSql(`drop table if exists "sensor_sample" cascade;`);

    this.addSql(`alter table "trial" drop column "origin", drop column "source_file_id", drop column "source_line", drop column "segment";`);
  }

}
